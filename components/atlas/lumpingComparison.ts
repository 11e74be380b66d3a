/** Pure helpers for the model page's side-by-side of the coarsest strong and coarsest exact lumping. */

/** Chains larger than this are not lumped while the page renders; the lump-chain job and the CLI take them. */
export const PAGE_LUMPING_MAX_STATES = 300;

export type LumpingRelation = "same" | "strong-coarser" | "exact-coarser" | "incomparable";

/** The blocks of a canonical partition as lists of state labels, block 0 first. */
export function blocksOf(partition: readonly number[], labels: readonly string[]): string[][] {
  const blocks: string[][] = [];
  partition.forEach((b, i) => (blocks[b] ??= []).push(labels[i] ?? String(i)));
  return blocks;
}

/** θ refines φ when any two states together in θ are together in φ. */
function refines(theta: readonly number[], phi: readonly number[]): boolean {
  const image = new Map<number, number>();
  for (let i = 0; i < theta.length; i++) {
    const seen = image.get(theta[i]);
    if (seen === undefined) image.set(theta[i], phi[i]);
    else if (seen !== phi[i]) return false;
  }
  return true;
}

/** How the coarsest strong and the coarsest exact lumping of one chain (same starting partition) stand to each other. */
export function compareLumpings(strong: readonly number[], exact: readonly number[]): LumpingRelation {
  if (strong.length !== exact.length) throw new RangeError(`partitions of ${strong.length} and ${exact.length} states`);
  const strongFiner = refines(strong, exact);
  const exactFiner = refines(exact, strong);
  if (strongFiner && exactFiner) return "same";
  if (exactFiner) return "strong-coarser";
  if (strongFiner) return "exact-coarser";
  return "incomparable";
}

const count = (n: number) => `${n} block${n === 1 ? "" : "s"}`;

/** One sentence for the page. */
export function comparisonSentence(relation: LumpingRelation, strongBlocks: number, exactBlocks: number): string {
  switch (relation) {
    case "same":
      return `They coincide on this chain: the same ${count(strongBlocks)}, so the partition is both strongly and exactly lumpable.`;
    case "strong-coarser":
      return `They differ: the strong lumping (${count(strongBlocks)}) is coarser, and the exact one (${count(exactBlocks)}) splits some of its blocks.`;
    case "exact-coarser":
      return `They differ: the exact lumping (${count(exactBlocks)}) is coarser, and the strong one (${count(strongBlocks)}) splits some of its blocks.`;
    case "incomparable":
      return `They differ and neither refines the other: ${count(strongBlocks)} for the strong lumping, ${count(exactBlocks)} for the exact one.`;
  }
}

/**
 * The `keep` query parameter: indices of states that start in blocks of their own (the rest start together),
 * the same starting partition as the lump-chain job form. Out-of-range and non-numeric values are dropped.
 */
export function parseKeepApart(value: string | string[] | undefined, states: number): number[] {
  const raw = value === undefined ? [] : Array.isArray(value) ? value : [value];
  const kept = new Set<number>();
  for (const v of raw.flatMap((s) => s.split(","))) {
    if (!/^\d+$/.test(v.trim())) continue;
    const i = Number(v.trim());
    if (i < states) kept.add(i);
  }
  return [...kept].sort((a, b) => a - b);
}

/** One starting label per state: each kept state its own, the others one shared label. */
export function startingLabels(states: number, keep: readonly number[]): string[] {
  const apart = new Set(keep);
  return Array.from({ length: states }, (_, i) => (apart.has(i) ? `state ${i}` : "rest"));
}
