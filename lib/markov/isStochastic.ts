import { ONE, ZERO, add, equals, formatRational } from "@/lib/rational";
import type { Matrix } from "./matrix";

/** Why a matrix is not a transition matrix (square, entries ≥ 0, each row summing to exactly 1), or null. */
export function stochasticIssue(p: Matrix): string | null {
  const n = p.length;
  if (n === 0) return "the matrix has no rows";
  for (let i = 0; i < n; i++) {
    if (p[i].length !== n) return `row ${i + 1} has ${p[i].length} entries; a ${n}-state chain needs ${n}`;
    let sum = ZERO;
    for (let j = 0; j < n; j++) {
      if (p[i][j].num < 0n) return `entry (${i + 1}, ${j + 1}) is negative (${formatRational(p[i][j])})`;
      sum = add(sum, p[i][j]);
    }
    if (!equals(sum, ONE)) return `row ${i + 1} sums to ${formatRational(sum)}, not 1`;
  }
  return null;
}

export function isStochastic(p: Matrix): boolean {
  return stochasticIssue(p) === null;
}
