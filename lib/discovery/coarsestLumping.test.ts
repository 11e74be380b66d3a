import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { MatrixInputError, checkLumping, type Matrix } from "@/lib/markov";
import { formatRational, parseRational, rational, type Rational } from "@/lib/rational";
import { allLumpings } from "./allLumpings";
import { coarsestLumping } from "./coarsestLumping";
import { seededRandom } from "./testSupport";

const q = (rows: string[][]): Matrix => rows.map((r) => r.map(parseRational));

/** Splits `total` into `parts` non-negative rationals with denominators dividing `den` (some parts may be zero). */
function splitExactly(total: Rational, parts: number, random: () => number, den = 12n): Rational[] {
  const units = (total.num * den) / total.den;
  const exact = (units * total.den) / den === total.num ? units : null;
  if (exact === null || parts === 1) return [total, ...new Array<Rational>(parts - 1).fill(rational(0))];
  const cuts = Array.from({ length: parts - 1 }, () => BigInt(Math.floor(random() * (Number(exact) + 1)))).sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
  const bounds = [0n, ...cuts, exact];
  return bounds.slice(1).map((b, i) => rational(b - bounds[i], den));
}

/**
 * A chain on n states that lifts a chain on m blocks: state i in block I sends, into each block J, a random split of
 * Q[I][J] over J's states. Such a chain is lumpable by the block partition, with lumped chain Q.
 */
function liftedChain(m: number, sizes: number[], random: () => number): { p: Matrix; blocks: number[] } {
  const qRows = Array.from({ length: m }, () => splitExactly(rational(1), m, random));
  const blocks = sizes.flatMap((s, I) => new Array<number>(s).fill(I));
  const members = sizes.map((_, I) => blocks.flatMap((b, i) => (b === I ? [i] : [])));
  const p: Matrix = blocks.map((I) => {
    const row = new Array<Rational>(blocks.length).fill(rational(0));
    for (let J = 0; J < m; J++) splitExactly(qRows[I][J], members[J].length, random).forEach((v, k) => (row[members[J][k]] = v));
    return row;
  });
  return { p, blocks };
}

/** θ ≤ φ: every block of θ lies inside a block of φ. */
function refines(theta: readonly number[], phi: readonly number[]): boolean {
  const image = new Map<number, number>();
  return theta.every((c, s) => {
    const seen = image.get(c);
    if (seen === undefined) image.set(c, phi[s]);
    return seen === undefined || seen === phi[s];
  });
}

describe("coarsestLumping", () => {
  it("lumps the Land of Oz chain by {rain, snow} | {nice} (Kemeny & Snell, Finite Markov Chains, 1960, §6.3; chain from Grinstead & Snell, Example 11.1)", () => {
    const oz = q([
      ["1/2", "1/4", "1/4"],
      ["1/2", "0", "1/2"],
      ["1/4", "1/4", "1/2"],
    ]);
    const result = coarsestLumping({ chain: oz, labels: ["weather", "nice", "weather"] });
    expect(result.partition).toEqual([0, 1, 0]);
    // lumped chain worked by hand: from R or S, 3/4 stay in {R, S} and 1/4 go to N; from N, all go to {R, S}
    expect(result.lumped?.map((r) => r.map(formatRational))).toEqual([
      ["3/4", "1/4"],
      ["1", "0"],
    ]);
    expect(checkLumping(oz, result.partition).ok).toBe(true);
  });

  it("equals the coarsest lumping found by enumerating all partitions, on random chains of up to 9 states", () => {
    const random = seededRandom(20261202);
    let nonTrivial = 0;
    for (let trial = 0; trial < 60; trial++) {
      const n = 2 + (trial % 8);
      const m = Math.min(n, 2 + Math.floor(random() * 3));
      const sizes = new Array<number>(m).fill(1);
      for (let extra = n - m; extra > 0; extra--) sizes[Math.floor(random() * m)]++;
      const { p, blocks } = liftedChain(m, sizes, random);
      // perturb one row on some trials so that not every chain is exactly a lift
      if (trial % 3 === 0 && n > 2) {
        const i = Math.floor(random() * n);
        p[i] = splitExactly(rational(1), n, random);
      }
      // labels: a coarsening of the lift's blocks on most trials (so the lift is a candidate), random otherwise
      const labels = trial % 4 === 3 ? Array.from({ length: n }, () => (random() < 0.3 ? "b" : "a")) : blocks.map((b) => (b % 2 === 0 ? "a" : "b"));
      const fast = coarsestLumping({ chain: p, labels });
      const all = allLumpings(p).filter((partition) => refines(partition, labels.map((l) => (l === "a" ? 0 : 1))));
      expect(all.some((partition) => partition.join(",") === fast.partition.join(","))).toBe(true);
      for (const partition of all) expect(refines(partition, fast.partition)).toBe(true);
      const check = checkLumping(p, fast.partition);
      expect(check.ok && check.lumped.map((r) => r.map(formatRational))).toEqual(fast.lumped?.map((r) => r.map(formatRational)));
      if (fast.blocks > new Set(labels).size && fast.blocks < n) nonTrivial++;
    }
    // the generator must exercise real refinement, not only the two extremes
    expect(nonTrivial).toBeGreaterThan(10);
  });

  it("property: a lift of a smaller chain has a coarsest lumping at least as coarse as the lift (fast-check)", () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 1, max: 4 }), { minLength: 1, maxLength: 5 }), fc.integer(), (sizes, seed) => {
        const random = seededRandom(seed);
        const { p, blocks } = liftedChain(sizes.length, sizes, random);
        const labels = blocks.map((b) => b % 2);
        const result = coarsestLumping({ chain: p, labels });
        expect(refines(blocks, result.partition)).toBe(true);
        expect(refines(result.partition, labels)).toBe(true);
        expect(checkLumping(p, result.partition).ok).toBe(true);
      }),
      { numRuns: 60 },
    );
  });

  it("lists every lumping of a small chain, coarsest first, each one checked by the core", () => {
    const p = q([
      ["1/2", "1/4", "1/4"],
      ["1/2", "0", "1/2"],
      ["1/4", "1/4", "1/2"],
    ]);
    const all = allLumpings(p);
    expect(all[0]).toEqual([0, 0, 0]);
    expect(all.at(-1)).toEqual([0, 1, 2]);
    for (const partition of all) expect(checkLumping(p, partition).ok).toBe(true);
  });

  it("rejects labels of the wrong length and a matrix that is not stochastic, naming the field", () => {
    const p = q([
      ["1/2", "1/2"],
      ["1/3", "1/3"],
    ]);
    expect(() => coarsestLumping({ chain: p, labels: ["a"] })).toThrow(/labels/);
    expect(() => coarsestLumping({ chain: p, labels: ["a", "b"] })).toThrow(MatrixInputError);
    expect(() => allLumpings(new Array(11).fill(null).map(() => new Array(11).fill(rational(1, 11))))).toThrow(/1\.\.10/);
  });

  it("stops when cancelled", () => {
    const controller = new AbortController();
    controller.abort();
    const p = q([
      ["1/2", "1/2"],
      ["1/2", "1/2"],
    ]);
    const labels = ["a", "b"];
    expect(coarsestLumping({ chain: p, labels, signal: controller.signal })).toMatchObject({ stopped: "cancelled", lumped: null });
    expect(labels).toEqual(["a", "b"]);
  });
});
