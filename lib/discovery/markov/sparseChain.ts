/**
 * Search-side chain representation: compressed rows of exact rationals, and the same entries scaled to integers
 * over a common denominator so that block sums are compared exactly with integer arithmetic.
 */
import { MatrixInputError, type Matrix } from "@/lib/markov";
import { ZERO, add, gcd, type Rational } from "@/lib/rational";

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

function lcm(a: bigint, b: bigint): bigint {
  return (a / gcd(a, b)) * b;
}

/**
 * Entries as integers over one common denominator L: numerators as doubles when every partial sum stays below
 * 2^53 (then integer addition in doubles is exact), else as BigInt.
 */
export type ScaledEntries = { kind: "number"; num: Float64Array; L: number } | { kind: "bigint"; num: bigint[]; L: bigint };

/**
 * Scales the entries; rejects negative entries, columns outside the chain and rows that do not sum to exactly 1
 * (a row sums to 1 exactly when its numerators sum to L; entries are non-negative, so partial sums only grow
 * and a partial sum above L already proves the row wrong).
 */
export function scaleEntries(chain: SparseChain): ScaledEntries {
  const { size, rowStart, col, value } = chain;
  let L = 1n;
  for (let e = 0; e < value.length; e++) {
    const v = value[e];
    if (v.num < 0n) throw new MatrixInputError("matrix", `entry (${rowOf(chain, e) + 1}, ${col[e] + 1}) is negative`);
    if (col[e] < 0 || col[e] >= size) throw new MatrixInputError("matrix", `row ${rowOf(chain, e) + 1} has a column ${col[e] + 1} outside 1..${size}`);
    if (v.den !== 1n && L % v.den !== 0n) L = lcm(L, v.den);
  }
  const badRow = (i: number, sum: Rational) => new MatrixInputError("matrix", `row ${i + 1} sums to ${sum.num}${sum.den === 1n ? "" : `/${sum.den}`}, not 1`);
  if (L <= BigInt(Number.MAX_SAFE_INTEGER)) {
    const Ln = Number(L);
    const num = Float64Array.from(value, (v) => Number((v.num * L) / v.den));
    for (let i = 0; i < size; i++) {
      let sum = 0;
      for (let e = rowStart[i]; e < rowStart[i + 1] && sum <= Ln; e++) sum += num[e];
      if (sum !== Ln) throw badRow(i, exactRowSum(chain, i));
    }
    return { kind: "number", num, L: Ln };
  }
  const num = value.map((v) => (v.num * L) / v.den);
  for (let i = 0; i < size; i++) {
    let sum = 0n;
    for (let e = rowStart[i]; e < rowStart[i + 1]; e++) sum += num[e];
    if (sum !== L) throw badRow(i, exactRowSum(chain, i));
  }
  return { kind: "bigint", num, L };
}

function rowOf(chain: SparseChain, e: number): number {
  let i = 0;
  while (chain.rowStart[i + 1] <= e) i++;
  return i;
}

function exactRowSum(chain: SparseChain, i: number): Rational {
  let sum = ZERO;
  for (let e = chain.rowStart[i]; e < chain.rowStart[i + 1]; e++) sum = add(sum, chain.value[e]);
  return sum;
}

/**
 * The transposed chain's structure (row j lists the states i with P[i][j] > 0) with the scaled entries moved along,
 * for the exact-lumping refinement. Sums of a column over a splitter are at most the column's total, so doubles
 * stay exact when every column total is below 2^53; otherwise the entries move to BigInt.
 */
export function transposeScaled(chain: SparseChain, scaled: ScaledEntries): { graph: Pick<SparseChain, "size" | "rowStart" | "col">; scaled: ScaledEntries } {
  const { size, rowStart, col } = chain;
  const start = new Int32Array(size + 1);
  for (let e = 0; e < col.length; e++) start[col[e] + 1]++;
  for (let j = 0; j < size; j++) start[j + 1] += start[j];
  const fill = start.slice(0, size);
  const from = new Int32Array(col.length);
  const edge = new Int32Array(col.length);
  for (let i = 0; i < size; i++)
    for (let e = rowStart[i]; e < rowStart[i + 1]; e++) {
      const k = fill[col[e]]++;
      from[k] = i;
      edge[k] = e;
    }
  const graph = { size, rowStart: start, col: from };
  if (scaled.kind === "number") {
    const num = new Float64Array(col.length);
    const total = new Float64Array(size);
    for (let k = 0; k < col.length; k++) num[k] = scaled.num[edge[k]];
    for (let e = 0; e < col.length; e++) total[col[e]] += scaled.num[e];
    if (total.every((t) => t <= Number.MAX_SAFE_INTEGER)) return { graph, scaled: { kind: "number", num, L: scaled.L } };
    return { graph, scaled: { kind: "bigint", num: Array.from(num, (v) => BigInt(v)), L: BigInt(scaled.L) } };
  }
  return { graph, scaled: { kind: "bigint", num: Array.from(edge, (e) => scaled.num[e]), L: scaled.L } };
}
