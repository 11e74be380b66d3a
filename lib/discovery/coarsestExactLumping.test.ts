/**
 * The coarsest exact lumping (Buchholz 1994; DOMAIN.md §2b) against brute force over every set partition of small
 * chains. The reference shares nothing with the implementation: it enumerates partitions itself and sums columns
 * with fraction.js, on BigInt fractions.
 */
import Fraction from "fraction.js";
import { describe, expect, it } from "vitest";
import { checkExactLumping, type Matrix } from "@/lib/markov";
import { rational } from "@/lib/rational";
import { coarsestLumping } from "./coarsestLumping";
import { seededRandom } from "./testSupport";

/** 1000003 is prime (common practice); 2^61 − 1 is a Mersenne prime (recalled from memory), past 2^53 on purpose. */
const PRIMES = [1_000_003n, 2n ** 61n - 1n];

type RefMatrix = Fraction[][];

function* partitionsOf(n: number): Generator<number[]> {
  const a = new Array<number>(n).fill(0);
  function* go(i: number, m: number): Generator<number[]> {
    if (i === n) yield a.slice();
    else
      for (let b = 0; b <= m && b < n; b++) {
        a[i] = b;
        yield* go(i + 1, Math.max(m, b + 1));
      }
  }
  yield* go(1, 1);
}

function exactlyLumpable(p: RefMatrix, part: number[]): boolean {
  const n = p.length;
  const B = Math.max(...part) + 1;
  for (let I = 0; I < B; I++) {
    const firstSum = new Map<number, Fraction>();
    for (let j = 0; j < n; j++) {
      let s = new Fraction(0);
      for (let i = 0; i < n; i++) if (part[i] === I) s = s.add(p[i][j]);
      const seen = firstSum.get(part[j]);
      if (!seen) firstSum.set(part[j], s);
      else if (!seen.equals(s)) return false;
    }
  }
  return true;
}

/** θ refines φ when states together in θ are together in φ. */
function refinesRef(theta: number[], phi: number[]): boolean {
  return theta.every((t, i) => theta.every((t2, j) => t !== t2 || phi[i] === phi[j]));
}

function bruteCoarsest(p: RefMatrix, labels: number[]): number[] {
  const ok = [...partitionsOf(p.length)].filter((part) => refinesRef(part, labels) && exactlyLumpable(p, part));
  const best = ok.reduce((a, b) => (Math.max(...b) < Math.max(...a) ? b : a));
  // uniqueness: every exactly lumpable refinement of the labels refines the coarsest one
  for (const part of ok) expect(refinesRef(part, best)).toBe(true);
  return best;
}

/**
 * Chains with structure: P[i][j] = v[L[i][j]] for a Latin square L (rows and columns are permutations of v), or
 * rows only permuted; v has repeated values, denominators a large prime.
 */
function randomChain(n: number, random: () => number, prime: bigint): { ref: RefMatrix; p: Matrix } {
  const distinct = 1 + Math.floor(random() * 3);
  const cuts = Array.from({ length: distinct }, () => BigInt(1 + Math.floor(random() * 1000)));
  const slots = Array.from({ length: n }, () => Math.floor(random() * distinct));
  const weights = slots.map((s) => cuts[s]);
  const total = weights.reduce((a, b) => a + b, 0n);
  // v[k] = weights[k] / total, rescaled onto the prime denominator exactly: numerators sum to `prime`
  const nums = weights.map((w) => (w * prime) / total);
  nums[0] += prime - nums.reduce((a, b) => a + b, 0n);
  const shift = Array.from({ length: n }, (_, i) => i).sort(() => random() - 0.5);
  const perm = Array.from({ length: n }, (_, i) => i).sort(() => random() - 0.5);
  const latin = random() < 0.7;
  const rowPerms = Array.from({ length: n }, () => Array.from({ length: n }, (_, i) => i).sort(() => random() - 0.5));
  const index = (i: number, j: number) => (latin ? (shift[i] + perm[j]) % n : rowPerms[i][j]);
  const ref = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => new Fraction(nums[index(i, j)], prime)));
  const p = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => rational(nums[index(i, j)], prime)));
  return { ref, p };
}

describe("coarsestLumping({ exact: true })", () => {
  it("equals the brute-force coarsest exact lumping over all partitions of random chains up to 9 states", () => {
    const random = seededRandom(1994);
    let nonTrivial = 0;
    for (let trial = 0; trial < 40; trial++) {
      const n = 2 + (trial % 8);
      const { ref, p } = randomChain(n, random, PRIMES[trial % 2]);
      const labels = Array.from({ length: n }, () => (random() < 0.7 ? 0 : Math.floor(random() * 3)));
      const found = coarsestLumping({ chain: p, labels, exact: true });
      const expected = bruteCoarsest(ref, labels);
      expect([n, found.partition]).toEqual([n, expected]);
      if (Math.max(...expected) + 1 < n) nonTrivial++;
      const check = checkExactLumping(p, found.partition);
      expect(check.ok && check.lumped).toEqual(found.lumped);
    }
    // the structured chains make non-trivial exact lumpings common, so the comparison is not vacuous
    expect(nonTrivial).toBeGreaterThan(10);
  }, 600_000);

  it("differs from the coarsest strong lumping where the two notions differ (hand-worked chain of checkExactLumping.test.ts)", () => {
    const p = [
      ["1/2", "1/4", "1/4"],
      ["1/3", "1/3", "1/3"],
      ["1/6", "5/12", "5/12"],
    ].map((r) => r.map((x) => rational(BigInt(x.split("/")[0]), BigInt(x.split("/")[1]))));
    // the chain is doubly stochastic, so one block is exactly lumpable (and, trivially, strongly): keep state 0 apart
    expect(coarsestLumping({ chain: p, labels: [0, 0, 0], exact: true }).partition).toEqual([0, 0, 0]);
    expect(coarsestLumping({ chain: p, labels: [0, 1, 1], exact: true }).partition).toEqual([0, 1, 1]);
    // strongly, rows 1 and 2 send 1/3 and 1/6 into {0}: the block {1, 2} splits
    expect(coarsestLumping({ chain: p, labels: [0, 1, 1] }).partition).toEqual([0, 1, 2]);
  });
});
