import { modelRuleTable, type Model } from "@/lib/models";
import type { MapSpec } from "./mapSpec";

/**
 * The claim the server builds a certificate from (POST /api/certificates `build`), from the canonical
 * source model and the map as drawn. Throws when the map's kind does not fit the source's class.
 */
export function buildRequest(source: Model, spec: MapSpec): Record<string, unknown> {
  const rule = (): Record<string, unknown> => {
    if (source.kind === "eca") return { rule: source.rule };
    if (source.kind === "ca") return { table: { k: source.k, r: source.r, table: source.table } };
    if (source.kind === "markov" || source.kind === "decimated") throw new Error("a cellular-automaton map needs a cellular automaton as its source");
    const t = modelRuleTable(source);
    return { table: { k: t.k, r: t.r, table: Array.from(t.table) } };
  };
  const chain = () => {
    if (source.kind !== "markov" && source.kind !== "decimated") throw new Error("a Markov-chain map needs a Markov chain as its source");
    return source;
  };
  switch (spec.kind) {
    case "projection":
      return { kind: "projection", ...rule(), block: spec.block, projection: spec.projection };
    case "blocking":
      return { kind: "blocking", ...rule(), block: spec.block };
    case "iterate":
      return { kind: "iterate", ...rule(), steps: spec.steps };
    case "lumping":
      return { kind: "lumping", chain: chain(), partition: spec.partition };
    case "decimation":
      return { kind: "decimation", chain: chain(), steps: spec.steps };
  }
}
