import { caShape, chainSize } from "@/lib/models";
import { tryCanonical } from "./derivedModels";
import type { Workbench } from "./workbenchState";

export type NodeShape = { kind: "ca"; k: number; r: number } | { kind: "markov"; states: number; labels: string[] };

/**
 * What a node is, as far as the canvas knows: from its model, or, when the model is still to be
 * determined by the map into it, from that map and its source (a block-N projection onto m symbols
 * gives an m-state CA of the source's radius, since R = ceil(rN/N) = r; an iterate multiplies r).
 */
export function nodeShape(w: Workbench, nodeId: string, depth = 0): NodeShape | null {
  const node = w.nodes.find((n) => n.id === nodeId);
  if (!node || depth > w.nodes.length) return null;
  const model = tryCanonical(node.model);
  if (model) {
    if (model.kind === "markov" || model.kind === "decimated") {
      const labels = labelsOf(model);
      return { kind: "markov", states: chainSize(model), labels };
    }
    return { kind: "ca", ...caShape(model) };
  }
  const incoming = w.edges.find((e) => e.target === nodeId);
  if (!incoming?.spec) return null;
  const source = nodeShape(w, incoming.source, depth + 1);
  if (!source) return null;
  const spec = incoming.spec;
  if (source.kind === "ca") {
    if (spec.kind === "projection") return { kind: "ca", k: Math.max(2, ...spec.projection.map((v) => v + 1)), r: source.r };
    if (spec.kind === "blocking") return { kind: "ca", k: source.k ** spec.block, r: source.r };
    if (spec.kind === "iterate") return { kind: "ca", k: source.k, r: source.r * spec.steps };
    return null;
  }
  if (spec.kind === "decimation") return source;
  if (spec.kind === "lumping" && spec.partition.length === source.states) {
    const blocks = Math.max(...spec.partition) + 1;
    const labels = Array.from({ length: blocks }, (_, b) => `{${source.labels.filter((_, i) => spec.partition[i] === b).join(",")}}`);
    return { kind: "markov", states: blocks, labels };
  }
  return null;
}

function labelsOf(model: { kind: string; labels?: string[]; base?: unknown }): string[] {
  if (model.kind === "markov") return model.labels ?? [];
  return model.base ? labelsOf(model.base as { kind: string }) : [];
}
