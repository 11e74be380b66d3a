import { formatRational, gcd, rational, type Rational } from "@/lib/rational";
import { canonicalPartition, blockCount } from "./canonicalPartition";
import { MatrixInputError } from "./matrix";
import type { ExactLumpingCounterexample } from "./checkExactLumping";

/** A chain given by rows of non-zero entries: row i is col/value[rowStart[i] … rowStart[i+1]); repeated columns add up. */
export interface SparseRows {
  size: number;
  rowStart: Int32Array;
  col: Int32Array;
  value: Rational[];
}

/** One entry Q[I][J] of the lumped chain. */
export type LumpedEntry = { from: number; to: number; value: Rational };

export type SparseExactLumpingCheck =
  | { ok: true; partition: number[]; blocks: number; lumped: LumpedEntry[] }
  | { ok: false; counterexample: ExactLumpingCounterexample };

/**
 * Exact lumpability (Buchholz, J. Appl. Probab. 31, 59–75, 1994; DOMAIN.md §2b) of a chain too large for a dense
 * matrix: for every pair of blocks I, J the column sum Σ_{i∈I} P[i][j] is the same for every j in J. Entries are
 * brought to integers over their common denominator L so that sums are exact; the chain must also be stochastic
 * (non-negative entries, every row summing to exactly 1). The lumped chain is Q[I][J] = |J| · Σ_{i∈I} P[i][j] / |I|.
 * Source block by source block, every column the block reaches is summed once, so the check is linear in the entries.
 * `lumped: false` leaves Q out (a fine partition of a large chain has as many entries in Q as the chain).
 */
export function checkExactLumpingSparse(chain: SparseRows, partition: readonly number[], options: { lumped?: boolean } = {}): SparseExactLumpingCheck {
  const { size, rowStart, col, value } = chain;
  if (partition.length !== size) throw new MatrixInputError("partition", `has ${partition.length} entries for a ${size}-state chain`);
  const blocks = canonicalPartition(partition);
  const B = blockCount(blocks);
  const L = value.reduce((l, v) => (l % v.den === 0n ? l : (l / gcd(l, v.den)) * v.den), 1n);
  // every sum below is at most L times a column total (≤ size), so doubles add these integers exactly
  if (L * BigInt(size) > BigInt(Number.MAX_SAFE_INTEGER)) throw new MatrixInputError("matrix", `the common denominator ${L} is too large for the sparse check`);
  const scaled = Float64Array.from(value, (v) => {
    if (v.num < 0n) throw new MatrixInputError("matrix", "has a negative entry");
    return Number((v.num * L) / v.den);
  });
  for (let i = 0; i < size; i++) {
    let sum = 0;
    for (let e = rowStart[i]; e < rowStart[i + 1]; e++) {
      if (col[e] < 0 || col[e] >= size) throw new MatrixInputError("matrix", `row ${i + 1} has a column outside 1..${size}`);
      sum += scaled[e];
    }
    if (sum !== Number(L)) throw new MatrixInputError("matrix", `row ${i + 1} does not sum to 1`);
  }
  const members = membersByBlock(blocks, B);
  const into = new Float64Array(size);
  const reached: number[] = [];
  const firstOf = new Int32Array(B).fill(-1);
  const count = new Int32Array(B);
  const lumped: LumpedEntry[] = [];
  for (let I = 0; I < B; I++) {
    for (const i of members[I])
      for (let e = rowStart[i]; e < rowStart[i + 1]; e++) {
        if (scaled[e] === 0) continue;
        if (into[col[e]] === 0) reached.push(col[e]);
        into[col[e]] += scaled[e];
      }
    const targets: number[] = [];
    for (const j of reached) {
      const J = blocks[j];
      if (firstOf[J] < 0) {
        firstOf[J] = j;
        targets.push(J);
      } else if (into[j] !== into[firstOf[J]]) return refuted(I, J, firstOf[J], j, into, L);
      count[J]++;
    }
    for (const J of targets) {
      // a state of J that I does not reach receives 0, while the first one receives a positive sum
      if (count[J] !== members[J].length) return refuted(I, J, firstOf[J], members[J].find((j) => into[j] === 0) as number, into, L);
      if (options.lumped !== false) lumped.push({ from: I, to: J, value: rational(BigInt(into[firstOf[J]]) * BigInt(members[J].length), L * BigInt(members[I].length)) });
    }
    for (const J of targets) {
      firstOf[J] = -1;
      count[J] = 0;
    }
    for (const j of reached) into[j] = 0;
    reached.length = 0;
  }
  return { ok: true, partition: blocks, blocks: B, lumped };
}

function membersByBlock(blocks: number[], B: number): number[][] {
  const members: number[][] = Array.from({ length: B }, () => []);
  for (let i = 0; i < blocks.length; i++) members[blocks[i]].push(i);
  return members;
}

function refuted(I: number, J: number, j: number, j2: number, into: Float64Array, L: bigint): SparseExactLumpingCheck {
  const sum = (x: number) => formatRational(rational(BigInt(into[x]), L));
  return { ok: false, counterexample: { kind: "not-exactly-lumpable", block: I, targetBlock: J, states: [j, j2], sums: [sum(j), sum(j2)] } };
}
