import { MatrixInputError } from "@/lib/markov";
import { ZERO, add, type Rational } from "@/lib/rational";
import { coverageRecord, type Coverage } from "./coverage";
import { refineToLumping } from "./markov/partitionRefinement";
import { isSparseChain, scaleEntries, sparseFromMatrix, type ChainInput, type SparseChain } from "./markov/sparseChain";
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
}

/**
 * The coarsest strongly lumpable partition of a chain that refines the partition given by `labels`
 * (it is unique: lumpable partitions are closed under joins), with its lumped chain.
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
  const refined = refineToLumping(chain, scaleEntries(chain), initial, () => stop() !== null);
  const stopped = stop();
  if (!refined || stopped)
    return { stopped: stopped ?? "cancelled", partition: [], blocks: 0, lumped: null, coverage: coverageRecord("lumping", null, [], stopped, `${chain.size} states`) };
  const partition = Array.from(refined.partition);
  const limit = options.lumpedLimit ?? 2000;
  options.onProgress?.(1, `${refined.blocks} blocks`);
  return {
    stopped: null,
    partition,
    blocks: refined.blocks,
    lumped: refined.blocks <= limit ? lumpedChain(chain, partition, refined.blocks) : null,
    coverage: coverageRecord("lumping", null, [], null, null),
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
