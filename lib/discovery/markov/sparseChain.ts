/**
 * Search-side chain representation: compressed rows of exact rationals, and the same entries scaled to integers
 * over a common denominator so that block sums are compared exactly with integer arithmetic.
 */
import { MatrixInputError, type Matrix } from "@/lib/markov";
import { ONE, ZERO, add, equals, gcd, type Rational } from "@/lib/rational";

/** A chain with n states; row i's non-zero entries are col/value[rowStart[i] … rowStart[i+1]). */
export interface SparseChain {
  size: number;
  rowStart: Int32Array;
  col: Int32Array;
  value: Rational[];
}

export type ChainInput = Matrix | SparseChain;

export function isSparseChain(chain: ChainInput): chain is SparseChain {
  return !Array.isArray(chain);
}

/** Dense rational matrix → sparse rows (zero entries dropped). */
export function sparseFromMatrix(p: Matrix): SparseChain {
  const n = p.length;
  const rowStart = new Int32Array(n + 1);
  const col: number[] = [];
  const value: Rational[] = [];
  for (let i = 0; i < n; i++) {
    if (p[i].length !== n) throw new MatrixInputError("matrix", `row ${i + 1} has ${p[i].length} entries for ${n} states`);
    for (let j = 0; j < n; j++) {
      if (p[i][j].num === 0n) continue;
      col.push(j);
      value.push(p[i][j]);
    }
    rowStart[i + 1] = col.length;
  }
  return { size: n, rowStart, col: Int32Array.from(col), value };
}

/** Rejects negative entries, out-of-range columns and rows that do not sum to exactly 1. */
export function assertStochastic(chain: SparseChain): void {
  const { size, rowStart, col, value } = chain;
  for (let i = 0; i < size; i++) {
    let sum = ZERO;
    for (let e = rowStart[i]; e < rowStart[i + 1]; e++) {
      if (col[e] < 0 || col[e] >= size) throw new MatrixInputError("matrix", `row ${i + 1} has a column ${col[e] + 1} outside 1..${size}`);
      if (value[e].num < 0n) throw new MatrixInputError("matrix", `entry (${i + 1}, ${col[e] + 1}) is negative`);
      sum = add(sum, value[e]);
    }
    if (!equals(sum, ONE)) throw new MatrixInputError("matrix", `row ${i + 1} sums to ${sum.num}/${sum.den}, not 1`);
  }
}

function lcm(a: bigint, b: bigint): bigint {
  return (a / gcd(a, b)) * b;
}

/**
 * Entries as integers over one common denominator L: numerators as doubles when every partial sum stays below
 * 2^53 (then integer addition in doubles is exact), else as BigInt.
 */
export type ScaledEntries = { kind: "number"; num: Float64Array } | { kind: "bigint"; num: BigInt64Array | bigint[] };

export function scaleEntries(chain: SparseChain): ScaledEntries {
  let L = 1n;
  for (const v of chain.value) if (v.den !== 1n && L % v.den !== 0n) L = lcm(L, v.den);
  // every row sums to 1, so every partial sum of numerators is at most L
  if (L <= BigInt(Number.MAX_SAFE_INTEGER)) return { kind: "number", num: Float64Array.from(chain.value, (v) => Number((v.num * L) / v.den)) };
  return { kind: "bigint", num: chain.value.map((v) => (v.num * L) / v.den) };
}
