import { MatrixInputError } from "@/lib/markov";
import { ZERO, add, mul, rational, type Rational } from "@/lib/rational";
import { coverageRecord, type Coverage } from "./coverage";
import { refineToLumping } from "./markov/partitionRefinement";
import { isSparseChain, scaleEntries, sparseFromMatrix, transposeScaled, type ChainInput, type SparseChain } from "./markov/sparseChain";
import { makeStopper, type LongRunOptions, type Stopped } from "./stopper";

export interface CoarsestLumping {
  stopped: Stopped;
  /** state → block in canonical form (blocks numbered by first appearance); empty when stopped */
  partition: number[];
  blocks: number;
  /** the lumped chain Q[I][J]; null when stopped or when it has more than `lumpedLimit` blocks */
  lumped: Rational[][] | null;
  coverage: Coverage;
}

export interface CoarsestLumpingOptions extends LongRunOptions {
  chain: ChainInput;
  /** one label per state: the initial partition (states the theorist wants to keep apart get different labels) */
  labels: ReadonlyArray<string | number>;
  /** @default 2000 */
  lumpedLimit?: number;
  /** exact lumpability (Buchholz 1994, column sums) instead of strong lumpability. @default false */
  exact?: boolean;
}

/**
 * The coarsest strongly (or, with `exact`, exactly) lumpable partition of a chain that refines the partition given
 * by `labels` (it is unique: lumpable partitions are closed under joins), with its lumped chain. The exact one is
 * the same splitter refinement run on the transposed chain.
 */
export function coarsestLumping(options: CoarsestLumpingOptions): CoarsestLumping {
  const chain: SparseChain = isSparseChain(options.chain) ? options.chain : sparseFromMatrix(options.chain);
  if (options.labels.length !== chain.size)
    throw new MatrixInputError("labels", `${options.labels.length} labels for a ${chain.size}-state chain`);
  const stop = makeStopper(options);
  const ids = new Map<string | number, number>();
  const initial = Int32Array.from(options.labels, (l) => {
    let id = ids.get(l);
    if (id === undefined) {
      id = ids.size;
      ids.set(l, id);
    }
    return id;
  });
  options.onProgress?.(0, `${chain.size} states`);
  // scaling also checks that the chain is stochastic, exactly
  const scaled = scaleEntries(chain);
  const shouldStop = () => stop() !== null;
  const transposed = options.exact ? transposeScaled(chain, scaled) : null;
  const refined = transposed ? refineToLumping(transposed.graph, transposed.scaled, initial, shouldStop, true) : refineToLumping(chain, scaled, initial, shouldStop);
  const stopped = stop();
  if (!refined || stopped)
    return {
      stopped: stopped ?? "cancelled",
      partition: [],
      blocks: 0,
      lumped: null,
      coverage: coverageRecord(options.exact ? "exact-lumping" : "lumping", null, [], stopped, `${chain.size} states`),
    };
  const partition = Array.from(refined.partition);
  const limit = options.lumpedLimit ?? 2000;
  options.onProgress?.(1, `${refined.blocks} blocks`);
  return {
    stopped: null,
    partition,
    blocks: refined.blocks,
    lumped: refined.blocks <= limit ? (options.exact ? exactLumpedChain : lumpedChain)(chain, partition, refined.blocks) : null,
    coverage: coverageRecord(options.exact ? "exact-lumping" : "lumping", null, [], null, null),
  };
}

/** Q[I][J] = Σ_{j∈J} P[i][j] for the first state i of block I (the same for every i in I once lumpable). */
export function lumpedChain(chain: SparseChain, partition: readonly number[], blocks: number): Rational[][] {
  const q: Rational[][] = Array.from({ length: blocks }, () => new Array<Rational>(blocks).fill(ZERO));
  const seen = new Uint8Array(blocks);
  for (let i = 0; i < chain.size; i++) {
    const I = partition[i];
    if (seen[I]) continue;
    seen[I] = 1;
    for (let e = chain.rowStart[i]; e < chain.rowStart[i + 1]; e++) {
      const J = partition[chain.col[e]];
      q[I][J] = add(q[I][J], chain.value[e]);
    }
  }
  return q;
}

/** Q[I][J] = |J| · Σ_{i∈I} P[i][j] / |I| for the first state j of block J (DOMAIN.md §2b). */
export function exactLumpedChain(chain: SparseChain, partition: readonly number[], blocks: number): Rational[][] {
  const size = new Array<number>(blocks).fill(0);
  for (const b of partition) size[b]++;
  const first = new Int32Array(blocks).fill(-1);
  for (let j = 0; j < chain.size; j++) if (first[partition[j]] < 0) first[partition[j]] = j;
  const isFirst = new Uint8Array(chain.size);
  for (const j of first) isFirst[j] = 1;
  const into: Rational[][] = Array.from({ length: blocks }, () => new Array<Rational>(blocks).fill(ZERO));
  for (let i = 0; i < chain.size; i++)
    for (let e = chain.rowStart[i]; e < chain.rowStart[i + 1]; e++) {
      const j = chain.col[e];
      if (isFirst[j]) into[partition[i]][partition[j]] = add(into[partition[i]][partition[j]], chain.value[e]);
    }
  // only the non-zero sums are scaled: a lumped chain of 1000 blocks has a million entries, nearly all zero, and
  // scaling each by a rational cost as much as the refinement itself
  return into.map((row, I) => row.map((sum, J) => (sum.num === 0n ? ZERO : mul(sum, rational(size[J], size[I])))));
}
