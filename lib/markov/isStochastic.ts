import { formatRational, gcd, rational } from "@/lib/rational";
import type { Matrix } from "./matrix";

/**
 * Why a matrix is not a transition matrix (square, entries ≥ 0, each row summing to exactly 1), or null.
 * Each row is summed over the least common multiple L of its denominators (Σ num·L/den = L), so no gcd
 * is ever taken between two large sums: the cost is linear in L's digits per entry.
 */
export function stochasticIssue(p: Matrix): string | null {
  const n = p.length;
  if (n === 0) return "the matrix has no rows";
  for (let i = 0; i < n; i++) {
    if (p[i].length !== n) return `row ${i + 1} has ${p[i].length} entries; a ${n}-state chain needs ${n}`;
    let common = 1n;
    for (let j = 0; j < n; j++) {
      if (p[i][j].num < 0n) return `entry (${i + 1}, ${j + 1}) is negative (${formatRational(p[i][j])})`;
      common = (common / gcd(common, p[i][j].den)) * p[i][j].den;
    }
    let sum = 0n;
    for (let j = 0; j < n; j++) sum += p[i][j].num * (common / p[i][j].den);
    if (sum !== common) return `row ${i + 1} sums to ${formatRational(rational(sum, common))}, not 1`;
  }
  return null;
}

export function isStochastic(p: Matrix): boolean {
  return stochasticIssue(p) === null;
}
