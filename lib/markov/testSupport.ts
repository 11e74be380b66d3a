import fc from "fast-check";
import { rational, type Rational } from "@/lib/rational";
import type { Matrix } from "./matrix";

/** A random row of n rationals ≥ 0 summing to exactly 1 (weights over a random denominator). */
export function stochasticRow(n: number): fc.Arbitrary<Rational[]> {
  return fc.array(fc.integer({ min: 0, max: 6 }), { minLength: n, maxLength: n }).map((w) => {
    const weights = w.some((x) => x > 0) ? w : w.map((_, i) => (i === 0 ? 1 : 0));
    const total = weights.reduce((a, b) => a + b, 0);
    return weights.map((x) => rational(x, total));
  });
}

export function stochasticMatrix(n: number): fc.Arbitrary<Matrix> {
  return fc.array(stochasticRow(n), { minLength: n, maxLength: n });
}

/**
 * A lift of a small chain Q (m states) to n states: each state i of block I spreads Q[I][J] over the
 * states of J with its own random weights. By construction the lift is lumpable by the partition with lumped Q.
 */
export function liftedChain(small: (m: number) => fc.Arbitrary<Matrix> = stochasticMatrix): fc.Arbitrary<{ q: Matrix; p: Matrix; partition: number[] }> {
  return fc.integer({ min: 1, max: 3 }).chain((m) =>
    fc
      .tuple(
        small(m),
        fc.array(fc.integer({ min: 0, max: m - 1 }), { minLength: m, maxLength: 6 }).map((extra) => [...Array.from({ length: m }, (_, i) => i), ...extra]),
      )
      .chain(([q, partition]) => {
        const n = partition.length;
        return fc
          .array(fc.array(fc.integer({ min: 1, max: 5 }), { minLength: n, maxLength: n }), { minLength: n, maxLength: n })
          .map((weights) => {
            const p: Matrix = weights.map((w, i) =>
              partition.map((J, j) => {
                const inJ = partition.reduce((s, b, l) => (b === J ? s + w[l] : s), 0);
                const share = q[partition[i]][J];
                return rational(share.num * BigInt(w[j]), share.den * BigInt(inJ));
              }),
            );
            return { q, p, partition };
          });
      }),
  );
}

/** Primes beyond the 10^5 trial division of matrixPower and beyond 2^26, so products pass 2^53 (values common practice). */
export const LARGE_PRIMES = [100_003n, 100_019n, 998_244_353n, 1_000_000_007n, 2_147_483_647n] as const;

/** A random row summing to 1 over one large prime denominator: q units cut at random points. */
export function largePrimeRow(n: number): fc.Arbitrary<Rational[]> {
  return fc
    .tuple(fc.constantFrom(...LARGE_PRIMES), fc.array(fc.bigInt({ min: 0n, max: 1n << 62n }), { minLength: n - 1, maxLength: n - 1 }))
    .map(([q, raw]) => {
      const cuts = raw.map((x) => x % (q + 1n)).sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
      const edges = [0n, ...cuts, q];
      return Array.from({ length: n }, (_, i) => rational(edges[i + 1] - edges[i], q));
    });
}

export function largePrimeMatrix(n: number): fc.Arbitrary<Matrix> {
  return fc.array(largePrimeRow(n), { minLength: n, maxLength: n });
}
