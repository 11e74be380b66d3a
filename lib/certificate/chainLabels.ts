import type { Model } from "@/lib/models";
import { blockLabel } from "./blockLabel";

/** The state labels of a chain-like model (a decimated chain has its base's labels); [] for a CA. */
export function chainLabels(model: Model): string[] {
  return model.kind === "markov" ? model.labels : model.kind === "decimated" ? chainLabels(model.base) : [];
}

/**
 * The labels a lumped chain's states must carry (FORMAT.md): block B, in the canonical numbering by first
 * appearance, is labelled "{a,b}" with the labels of its states in the source's order (cut to fit the
 * label bound as blockLabel says). Labels are part of
 * a model's address, so a lumped chain is named by what it lumps, not by the issuer's choice.
 */
export function blockLabels(labels: readonly string[], partition: readonly number[]): string[] {
  const blocks = partition.reduce((m, b) => Math.max(m, b + 1), 0);
  return Array.from({ length: blocks }, (_, b) => blockLabel(labels.filter((_, i) => partition[i] === b), b));
}
