import { describe, expect, it } from "vitest";
import fc from "fast-check";
import Fraction from "fraction.js";
import { compare, formatRational, parseRational, rational, sub, type Rational } from "@/lib/rational";
import {
  MatrixInputError,
  canonicalPartition,
  checkLumping,
  formatMatrix,
  identityMatrix,
  isStochastic,
  matricesEqual,
  matrixPower,
  matrixProduct,
  parseCsvMatrix,
  parseMatrixMarket,
  stochasticIssue,
  type Matrix,
} from "./index";
import { largePrimeMatrix, liftedChain, stochasticMatrix } from "./testSupport";

const m = (rows: string[][]): Matrix => rows.map((r) => r.map(parseRational));
/** Grinstead & Snell, Introduction to Probability, Example 11.1 (Land of Oz weather: Rain, Nice, Snow). */
const OZ = m([
  ["1/2", "1/4", "1/4"],
  ["1/2", "0", "1/2"],
  ["1/4", "1/4", "1/2"],
]);

describe("Grinstead & Snell Example 11.1 weather chain", () => {
  it("is stochastic", () => {
    expect(isStochastic(OZ)).toBe(true);
  });

  it("has two-step matrix 7/16 3/16 3/8 | 3/8 1/4 3/8 | 3/8 3/16 7/16 (the book prints .438 .188 .375 …, recalled from memory)", () => {
    expect(formatMatrix(matrixPower(OZ, 2))).toEqual([
      ["7/16", "3/16", "3/8"],
      ["3/8", "1/4", "3/8"],
      ["3/8", "3/16", "7/16"],
    ]);
  });

  it("approaches the fixed vector (2/5, 1/5, 2/5) of Grinstead & Snell §11.3 (recalled from memory): |P^64 − w| < 2^-60", () => {
    const w = [rational(2, 5), rational(1, 5), rational(2, 5)];
    const eps = rational(1n, 2n ** 60n);
    for (const row of matrixPower(OZ, 64))
      row.forEach((x, j) => {
        const d = sub(x, w[j]);
        expect(compare(d.num < 0n ? { num: -d.num, den: d.den } : d, eps)).toBe(-1);
      });
  });

  it("lumps by {R,S}|{N} to [[3/4,1/4],[1,0]] (Kemeny & Snell, Finite Markov Chains, 1960, §6.3)", () => {
    const check = checkLumping(OZ, [0, 1, 0]);
    expect(check.ok && formatMatrix(check.lumped)).toEqual([
      ["3/4", "1/4"],
      ["1", "0"],
    ]);
  });

  it("does not lump by {R,N}|{S}: R and N reach S with 1/4 and 1/2 (Kemeny & Snell §6.3)", () => {
    const check = checkLumping(OZ, [0, 0, 1]);
    expect(check.ok).toBe(false);
    if (!check.ok) {
      const { block, states, targetBlock, sums } = check.counterexample;
      expect({ block, states, targetBlock, sums }).toEqual({ block: 0, states: [0, 1], targetBlock: 0, sums: ["3/4", "1/2"] });
      // Re-check independently with fraction.js from the raw matrix.
      const inBlock = [0, 1];
      const sumInto = (i: number) => inBlock.reduce((s, j) => s.add(new Fraction(OZ[i][j].num, OZ[i][j].den)), new Fraction(0));
      expect(sumInto(states[0]).toFraction()).toBe(sums[0]);
      expect(sumInto(states[1]).toFraction()).toBe(sums[1]);
    }
  });
});

describe("matrixPower", () => {
  it("agrees with repeated multiplication in fraction.js (general-purpose reference library), small and large prime denominators", () => {
    const chains = fc.integer({ min: 1, max: 4 }).chain((n) => fc.oneof(stochasticMatrix(n), largePrimeMatrix(n)));
    fc.assert(
      fc.property(chains, fc.integer({ min: 0, max: 9 }), (p, k) => {
        const F = p.map((row) => row.map((x) => new Fraction(x.num, x.den)));
        let acc = F.map((row, i) => row.map((_, j) => new Fraction(i === j ? 1 : 0)));
        for (let s = 0; s < k; s++) acc = acc.map((row) => F[0].map((_, j) => row.reduce((sum, x, l) => sum.add(x.mul(F[l][j])), new Fraction(0))));
        expect(formatMatrix(matrixPower(p, k))).toEqual(acc.map((row) => row.map((x) => x.toFraction())));
      }),
      { numRuns: 60 },
    );
  });

  it("multiplies exponents: (P^a)^b = P^(ab), and keeps the result stochastic and in lowest terms", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 4 }).chain(stochasticMatrix), fc.integer({ min: 1, max: 5 }), fc.integer({ min: 1, max: 5 }), (p, a, b) => {
        const direct = matrixPower(p, a * b);
        expect(matricesEqual(matrixPower(matrixPower(p, a), b), direct)).toBe(true);
        expect(isStochastic(direct)).toBe(true);
        for (const row of direct) for (const x of row) expect(formatRational(x)).toBe(formatRational(rational(x.num, x.den)));
      }),
      { numRuns: 40 },
    );
  });

  it("reduces every entry: denominators 100003 and 100019 (primes beyond its trial division) give P² exactly as fraction.js does", () => {
    const p = m([
      ["1/100003", "100002/100003"],
      ["7/100019", "100012/100019"],
    ]);
    const F = p.map((row) => row.map((x) => new Fraction(x.num, x.den)));
    const squared = F.map((row) => F[0].map((_, j) => row[0].mul(F[0][j]).add(row[1].mul(F[1][j])).toFraction()));
    // Entry (0, 0) by hand: 1/100003² + (100002/100003)(7/100019) = (100019 + 7·100002·100003)/(100003²·100019).
    expect(squared[0][0]).toBe(new Fraction(100019n + 7n * 100002n * 100003n, 100003n * 100003n * 100019n).toFraction());
    expect(formatMatrix(matrixPower(p, 2))).toEqual(squared);
    const cubed = F.map((row) => F[0].map((_, j) => row.reduce((sum, x, l) => sum.add(x.mul(new Fraction(squared[l][j]))), new Fraction(0)).toFraction()));
    expect(formatMatrix(matrixPower(p, 3))).toEqual(cubed);
  });

  it("gives the identity for k = 0 and refuses negative or fractional exponents", () => {
    expect(matricesEqual(matrixPower(OZ, 0), identityMatrix(3))).toBe(true);
    expect(() => matrixPower(OZ, -1)).toThrow(MatrixInputError);
    expect(() => matrixPower(OZ, 1.5)).toThrow(MatrixInputError);
  });

  it("does not mutate its input", () => {
    const before = formatMatrix(OZ);
    matrixPower(OZ, 7);
    expect(formatMatrix(OZ)).toEqual(before);
  });
});

describe("strong lumping (Kemeny & Snell §6.3)", () => {
  it("property: a lift of a random smaller chain is lumpable by the lift's partition, with lumped matrix the small chain", () => {
    fc.assert(
      fc.property(liftedChain(), ({ q, p, partition }) => {
        expect(isStochastic(p)).toBe(true);
        const check = checkLumping(p, partition);
        expect(check.ok).toBe(true);
        if (check.ok) expect(matricesEqual(check.lumped, q)).toBe(true);
      }),
      { numRuns: 60 },
    );
  });

  it("property: lumping commutes with decimation (DOMAIN.md §3): P^k lumps by the same partition to Q^k", () => {
    fc.assert(
      fc.property(liftedChain(), fc.integer({ min: 1, max: 6 }), ({ q, p, partition }, k) => {
        const check = checkLumping(matrixPower(p, k), partition);
        expect(check.ok && matricesEqual(check.lumped, matrixPower(q, k))).toBe(true);
      }),
      { numRuns: 40 },
    );
  });

  it("property: an accepted lumping is lumpable by an independent fraction.js check, with that lumped matrix; a refused one names two states whose sums differ", () => {
    const chains = fc.integer({ min: 2, max: 5 }).chain((n) => fc.oneof(stochasticMatrix(n), largePrimeMatrix(n)));
    let accepted = 0;
    fc.assert(
      fc.property(chains, fc.array(fc.integer({ min: 0, max: 2 }), { minLength: 5, maxLength: 5 }), (p, raw) => {
        const partition = canonicalPartition(raw.slice(0, p.length));
        const check = checkLumping(p, partition);
        const reference = lumpedByFractionJs(p, partition);
        if (check.ok) {
          accepted++;
          expect(reference).not.toBeNull();
          expect(formatMatrix(check.lumped)).toEqual(reference);
          return;
        }
        expect(reference).toBeNull();
        const { block, states, targetBlock, sums } = check.counterexample;
        const sumInto = (i: number): Rational =>
          p[i].reduce((s, x, j) => (partition[j] === targetBlock ? { num: s.num * x.den + x.num * s.den, den: s.den * x.den } : s), { num: 0n, den: 1n });
        expect(partition[states[0]]).toBe(block);
        expect(partition[states[1]]).toBe(block);
        expect(formatRational(rational(sumInto(states[0]).num, sumInto(states[0]).den))).toBe(sums[0]);
        expect(formatRational(rational(sumInto(states[1]).num, sumInto(states[1]).den))).toBe(sums[1]);
        expect(sums[0]).not.toBe(sums[1]);
      }),
      { numRuns: 120 },
    );
    expect(accepted).toBeGreaterThan(0);
  });

  it("property: a lift of a chain with large prime denominators (10^9+7, 998244353, …) lumps onto it", () => {
    fc.assert(
      fc.property(liftedChain(largePrimeMatrix), ({ q, p, partition }) => {
        const check = checkLumping(p, partition);
        expect(check.ok && formatMatrix(check.lumped)).toEqual(formatMatrix(q));
      }),
      { numRuns: 40 },
    );
  });

  it("checks the last state too: the weather chain with S = (1/2, 1/2, 0) does not lump by {R,S}|{N}, and only state 2 shows it", () => {
    const p = m([
      ["1/2", "1/4", "1/4"],
      ["1/2", "0", "1/2"],
      ["1/2", "1/2", "0"],
    ]);
    expect(checkLumping(p, [0, 1, 0])).toEqual({ ok: false, counterexample: { kind: "not-lumpable", block: 0, states: [0, 2], targetBlock: 0, sums: ["3/4", "1/2"] } });
  });

  it("numbers blocks in order of first appearance", () => {
    expect(canonicalPartition([2, 2, 0, 1])).toEqual([0, 0, 1, 2]);
    expect(() => canonicalPartition([0, -1])).toThrow(MatrixInputError);
  });

  it("refuses a partition of the wrong length", () => {
    expect(() => checkLumping(OZ, [0, 1])).toThrow(/2 entries for a 3-state chain/);
  });
});

describe("stochastic matrices", () => {
  it("names the row that does not sum to 1, a negative entry, or a ragged row", () => {
    expect(stochasticIssue(m([["1/2", "1/3"], ["0", "1"]]))).toMatch(/row 1 sums to 5\/6/);
    expect(stochasticIssue(m([["3/2", "-1/2"], ["0", "1"]]))).toMatch(/negative/);
    expect(stochasticIssue(m([["1"], ["0", "1"]]))).toMatch(/row 1 has 1 entries/);
  });
});

describe("matrix files", () => {
  it("reads CSV of rationals and decimals exactly", () => {
    expect(formatMatrix(parseCsvMatrix("# weather\n1/2, 0.25, 0.25\n0.5,0,1/2\n\n1/4,1/4,0.5\n"))).toEqual(formatMatrix(OZ));
  });

  it("names the line and column of a bad CSV entry and refuses ragged rows", () => {
    expect(() => parseCsvMatrix("1/2,1/2\n1,x\n")).toThrow(/line 2, column 2/);
    expect(() => parseCsvMatrix("1/2,1/2\n1\n")).toThrow(/row 2 has 1 entries/);
  });

  it("reads a Matrix Market coordinate file (NIST exchange format), with decimals and exponents", () => {
    const text = "%%MatrixMarket matrix coordinate real general\n% Land of Oz\n3 3 8\n1 1 0.5\n1 2 2.5e-1\n1 3 0.25\n2 1 0.5\n2 3 0.5\n3 1 0.25\n3 2 0.25\n3 3 0.5\n";
    expect(formatMatrix(parseMatrixMarket(text))).toEqual(formatMatrix(OZ));
  });

  it("mirrors symmetric coordinate files and reads column-major array files", () => {
    expect(formatMatrix(parseMatrixMarket("%%MatrixMarket matrix coordinate real symmetric\n2 2 2\n1 1 0.5\n2 1 0.5\n"))).toEqual([
      ["1/2", "1/2"],
      ["1/2", "0"],
    ]);
    expect(formatMatrix(parseMatrixMarket("%%MatrixMarket matrix array real general\n2 2\n1\n0.5\n0\n0.5\n"))).toEqual([
      ["1", "0"],
      ["1/2", "1/2"],
    ]);
  });

  it("refuses a bad header, an index out of range and a wrong entry count", () => {
    expect(() => parseMatrixMarket("3 3 1\n1 1 1\n")).toThrow(/line 1/);
    expect(() => parseMatrixMarket("%%MatrixMarket matrix coordinate real general\n2 2 1\n3 1 1\n")).toThrow(/outside a 2×2/);
    expect(() => parseMatrixMarket("%%MatrixMarket matrix coordinate real general\n2 2 2\n1 1 1\n")).toThrow(/announces 2 entries/);
  });
});

describe("matrixProduct", () => {
  it("agrees with matrixPower for two factors", () => {
    expect(matricesEqual(matrixProduct(OZ, OZ), matrixPower(OZ, 2))).toBe(true);
  });
});

/** Strong lumpability checked with fraction.js alone (Kemeny & Snell §6.3): the lumped matrix as strings, or null. */
function lumpedByFractionJs(p: Matrix, partition: number[]): string[][] | null {
  const blocks = Math.max(...partition) + 1;
  const sums = p.map((row) => Array.from({ length: blocks }, (_, J) => row.reduce((s, x, j) => (partition[j] === J ? s.add(new Fraction(x.num, x.den)) : s), new Fraction(0))));
  const q: string[][] = [];
  for (let I = 0; I < blocks; I++) {
    const members = partition.flatMap((b, i) => (b === I ? [i] : []));
    for (const i of members) for (let J = 0; J < blocks; J++) if (!sums[i][J].equals(sums[members[0]][J])) return null;
    q.push(sums[members[0]].map((x) => x.toFraction()));
  }
  return q;
}
