import { caShape, canonicalModel, describeModel, type Model, type ModelInput } from "@/lib/models";

export type DeriveKind = "blocking" | "iterate" | "decimation";

/** The canonical model, or null when the input is not a valid model (forms report why). */
export function tryCanonical(model: ModelInput | null): Model | null {
  if (!model) return null;
  try {
    return canonicalModel(model);
  } catch {
    return null;
  }
}

export function isCellular(model: ModelInput | null): boolean {
  return model !== null && model.kind !== "markov" && model.kind !== "decimated";
}

export function modelName(model: ModelInput | null): string {
  const c = tryCanonical(model);
  return c ? describeModel(c) : "model to be derived";
}

/** The model a derivation gives, its default name, and what a person should know about it. */
export function derivedModel(base: ModelInput, kind: DeriveKind, n: number): { model: ModelInput; name: string; note: string } {
  const model: ModelInput =
    kind === "blocking" ? { kind: "supercell", base, block: n } : kind === "iterate" ? { kind: "iterate", base, steps: n } : { kind: "decimated", base, steps: n };
  const canonical = tryCanonical(model);
  const name = canonical ? describeModel(canonical) : `${modelName(base)} (${kind} ${n})`;
  return { model, name, note: derivedNote(base, kind, n) };
}

function derivedNote(base: ModelInput, kind: DeriveKind, n: number): string {
  if (kind === "decimation") return `The ${n}-step decimation P^${n} of the chain, computed exactly.`;
  const b = tryCanonical(base);
  if (!b || !isCellular(b)) return "";
  const { k, r } = caShape(b);
  if (kind === "iterate") {
    const was = b.kind === "eca" ? "an ECA" : `a ${k}-state radius-${r} CA`;
    const still = b.kind === "eca" && n > 1 ? `, no longer an ECA` : "";
    return `The ${n}-step iterate of ${was} is a ${k === 2 ? "binary" : `${k}-state`} radius-${r * n} CA${still}.`;
  }
  const states = k ** n;
  return `The block-${n} supercell CA has ${states} block states (alphabet ${k}^${n}) and radius ${Math.ceil((r * n) / n)}, one supercell step being ${n} steps.`;
}

/**
 * What a node is called on the canvas and in lists: its name, else its model's short name, else
 * "model to be derived n" numbered in the order such nodes were drawn, so two of them never read alike.
 */
export function nodeLabel(nodes: { id: string; name: string; model: ModelInput | null }[], id: string): string {
  const node = nodes.find((n) => n.id === id);
  if (!node) return "?";
  if (node.name) return node.name;
  if (node.model) return modelName(node.model);
  const pending = nodes.filter((n) => !n.name && !n.model);
  return `model to be derived ${pending.findIndex((n) => n.id === id) + 1}`;
}
