import Fraction from "fraction.js";
import { Matrix as MlMatrix, solve } from "ml-matrix";
import { describe, expect, it } from "vitest";
import { formatRational, parseRational, rational, type Rational } from "@/lib/rational";
import { communicatingClasses, stationaryDistributions } from "./stationaryDistributions";

const chain = (rows: string[][]) => rows.map((r) => r.map(parseRational));
const text = (xs: Rational[]) => xs.map(formatRational);

/** π P = π checked with fraction.js, independently of the code under test. */
function isStationary(pi: Rational[], rows: string[][]): boolean {
  return rows[0].every((_, j) => {
    let sum = new Fraction(0);
    pi.forEach((x, i) => (sum = sum.add(new Fraction(`${x.num}/${x.den}`).mul(new Fraction(rows[i][j])))));
    return sum.equals(new Fraction(`${pi[j].num}/${pi[j].den}`));
  });
}

describe("stationaryDistributions", () => {
  it("gives the Land of Oz weather its fixed vector (2/5, 1/5, 2/5) (Grinstead & Snell, Introduction to Probability, Example 11.1; the vector recalled from memory)", () => {
    const oz = [
      ["1/2", "1/4", "1/4"],
      ["1/2", "0", "1/2"],
      ["1/4", "1/4", "1/2"],
    ];
    const result = stationaryDistributions(chain(oz));
    expect(result.closed).toHaveLength(1);
    expect(text(result.closed[0].distribution)).toEqual(["2/5", "1/5", "2/5"]);
    expect(result.transient).toEqual([]);
    expect(isStationary(result.closed[0].distribution, oz)).toBe(true);
  });

  it("gives the demo's twin-bay queue (2/7, 3/14, 3/14, 2/7), worked by hand from the bays' symmetry", () => {
    // π_left = π_right = a; π_empty = π_empty/2 + 2a/3 gives π_empty = 4a/3, likewise π_both; 14a/3 = 1.
    const twinBay = [
      ["1/2", "1/4", "1/4", "0"],
      ["1/3", "1/3", "0", "1/3"],
      ["1/3", "0", "1/3", "1/3"],
      ["0", "1/4", "1/4", "1/2"],
    ];
    expect(text(stationaryDistributions(chain(twinBay)).closed[0].distribution)).toEqual(["2/7", "3/14", "3/14", "2/7"]);
  });

  it("gives one distribution per closed class and names the transient states", () => {
    // A gambler's ruin on {0, 1, 2, 3} with fair steps: 0 and 3 absorb, 1 and 2 are transient.
    const ruin = [
      ["1", "0", "0", "0"],
      ["1/2", "0", "1/2", "0"],
      ["0", "1/2", "0", "1/2"],
      ["0", "0", "0", "1"],
    ];
    const result = stationaryDistributions(chain(ruin));
    expect(result.closed.map((c) => c.states)).toEqual([[0], [3]]);
    expect(text(result.closed[0].distribution)).toEqual(["1", "0", "0", "0"]);
    expect(text(result.closed[1].distribution)).toEqual(["0", "0", "0", "1"]);
    expect(result.transient).toEqual([1, 2]);
  });

  it("finds the communicating classes of a periodic two-cycle plus a state that feeds it", () => {
    const P = chain([
      ["0", "1", "0"],
      ["1", "0", "0"],
      ["1/2", "0", "1/2"],
    ]);
    expect(communicatingClasses(P)).toEqual([[0, 1], [2]]);
    expect(text(stationaryDistributions(P).closed[0].distribution)).toEqual(["1/2", "1/2", "0"]);
  });
});

/** A seeded generator (mulberry32, common practice) so that a failure can be replayed. */
function generator(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let z = s;
    z = Math.imul(z ^ (z >>> 15), z | 1);
    z ^= z + Math.imul(z ^ (z >>> 7), z | 61);
    return ((z ^ (z >>> 14)) >>> 0) / 4294967296;
  };
}

/** A random stochastic row with small integer weights (some zero), as exact rationals. */
function randomRow(next: () => number, width: number, zeros: boolean): Rational[] {
  const weights: number[] = Array.from({ length: width }, () => (zeros && next() < 0.3 ? 0 : 1 + Math.floor(next() * 9)));
  if (!weights.some((w) => w > 0)) weights[0] = 1;
  const total = weights.reduce((a, b) => a + b, 0);
  return weights.map((w) => rational(w, total));
}

/** The stationary vector by floating-point linear algebra (ml-matrix): (Pᵀ − I) π = 0 with the last equation replaced by Σ π = 1. */
function floatStationary(P: number[][]): number[] {
  const n = P.length;
  const A = MlMatrix.zeros(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) A.set(i, j, P[j][i] - (i === j ? 1 : 0));
  for (let j = 0; j < n; j++) A.set(n - 1, j, 1);
  const b = MlMatrix.columnVector(Array.from({ length: n }, (_, i) => (i === n - 1 ? 1 : 0)));
  return solve(A, b).to1DArray();
}

const asFloat = (x: Rational) => Number(x.num) / Number(x.den);

describe("stationaryDistributions against ml-matrix on random chains", () => {
  it("agrees within 1e-9 on 200 random irreducible chains of 2–9 states (all entries positive)", () => {
    const next = generator(20261203);
    for (let trial = 0; trial < 200; trial++) {
      const n = 2 + Math.floor(next() * 8);
      const P = Array.from({ length: n }, () => randomRow(next, n, false));
      const exact = stationaryDistributions(P);
      expect(exact.closed).toHaveLength(1);
      const float = floatStationary(P.map((r) => r.map(asFloat)));
      exact.closed[0].distribution.forEach((x, i) => expect(Math.abs(asFloat(x) - float[i])).toBeLessThan(1e-9));
    }
  });

  it("agrees class by class on 100 random reducible chains: two closed blocks and a transient state feeding both", () => {
    const next = generator(7);
    for (let trial = 0; trial < 100; trial++) {
      const a = 1 + Math.floor(next() * 4);
      const b = 1 + Math.floor(next() * 4);
      const n = a + b + 1;
      const zero = rational(0);
      const P: Rational[][] = [];
      for (let i = 0; i < a; i++) P.push([...randomRow(next, a, false), ...Array<Rational>(b + 1).fill(zero)]);
      for (let i = 0; i < b; i++) P.push([...Array<Rational>(a).fill(zero), ...randomRow(next, b, false), zero]);
      P.push(randomRow(next, n, false));
      const exact = stationaryDistributions(P);
      expect(exact.closed.map((c) => c.states.length)).toEqual([a, b]);
      expect(exact.transient).toEqual([n - 1]);
      const blocks = [Array.from({ length: a }, (_, i) => i), Array.from({ length: b }, (_, i) => a + i)];
      blocks.forEach((states, k) => {
        const float = floatStationary(states.map((i) => states.map((j) => asFloat(P[i][j]))));
        states.forEach((s, i) => expect(Math.abs(asFloat(exact.closed[k].distribution[s]) - float[i])).toBeLessThan(1e-9));
      });
    }
  });
});
