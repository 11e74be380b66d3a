import { describe, expect, it } from "vitest";
import fc from "fast-check";
import Fraction from "fraction.js";
import {
  ONE,
  ZERO,
  RationalSyntaxError,
  add,
  compare,
  div,
  equals,
  formatRational,
  isZero,
  mul,
  neg,
  parseRational,
  rational,
  sub,
  type Rational,
} from "./index";

const bigints = fc.bigInt({ min: -(10n ** 30n), max: 10n ** 30n });
const positive = fc.bigInt({ min: 1n, max: 10n ** 30n });
const rationals = fc.tuple(bigints, positive).map(([n, d]) => rational(n, d));

function viaFraction(r: Rational): Fraction {
  return new Fraction(r.num, r.den);
}
function sameAsFraction(r: Rational, f: Fraction): void {
  // fraction.js keeps the sign apart (s) from numerator and denominator (n, d), both in lowest terms.
  expect(r.num).toBe(f.s * f.n);
  expect(r.den).toBe(f.d);
}

describe("rationals, cross-checked against fraction.js 5 (general-purpose reference library)", () => {
  it("add, sub, mul and div agree with fraction.js and stay in lowest terms", () => {
    fc.assert(
      fc.property(rationals, rationals, (a, b) => {
        sameAsFraction(add(a, b), viaFraction(a).add(viaFraction(b)));
        sameAsFraction(sub(a, b), viaFraction(a).sub(viaFraction(b)));
        sameAsFraction(mul(a, b), viaFraction(a).mul(viaFraction(b)));
        if (!isZero(b)) sameAsFraction(div(a, b), viaFraction(a).div(viaFraction(b)));
      }),
      { numRuns: 500 },
    );
  });

  it("compare agrees with fraction.js", () => {
    fc.assert(fc.property(rationals, rationals, (a, b) => compare(a, b) === Math.sign(viaFraction(a).compare(viaFraction(b)))));
  });

  it("parses decimals exactly as fraction.js does", () => {
    for (const text of ["0.125", "-0.5", "3", "12.75", "0.1", "-7"]) sameAsFraction(parseRational(text), new Fraction(text));
  });

  it("formats and parses back to the same value", () => {
    fc.assert(fc.property(rationals, (a) => equals(parseRational(formatRational(a)), a)));
  });
});

describe("parseRational", () => {
  it("reads p/q, integers, signs, decimals and exponents exactly", () => {
    expect(parseRational("2/4")).toEqual({ num: 1n, den: 2n });
    expect(parseRational("-3/9")).toEqual({ num: -1n, den: 3n });
    expect(parseRational(" 5 ")).toEqual({ num: 5n, den: 1n });
    expect(parseRational("0.125")).toEqual({ num: 1n, den: 8n });
    expect(parseRational(".5")).toEqual({ num: 1n, den: 2n });
    expect(parseRational("2.5e-3")).toEqual({ num: 1n, den: 400n });
    expect(parseRational("1E2")).toEqual({ num: 100n, den: 1n });
  });

  it("keeps 0.1 exact where a float would not", () => {
    expect(formatRational(parseRational("0.1"))).toBe("1/10");
    expect(formatRational(add(parseRational("0.1"), parseRational("0.2")))).toBe("3/10");
  });

  it("refuses non-numbers and zero denominators with RationalSyntaxError", () => {
    for (const bad of ["", "abc", "1/0", "1//2", "0x10", "1/2/3", ".", "1e", "NaN", "1.5/2", "1e99999"])
      expect(() => parseRational(bad), bad).toThrow(RationalSyntaxError);
  });
});

describe("rational arithmetic", () => {
  it("has ZERO and ONE as neutral elements", () => {
    fc.assert(fc.property(rationals, (a) => equals(add(a, ZERO), a) && equals(mul(a, ONE), a)));
  });

  it("normalises the sign into the numerator", () => {
    expect(rational(3n, -6n)).toEqual({ num: -1n, den: 2n });
    expect(neg(rational(1n, 2n))).toEqual({ num: -1n, den: 2n });
    expect(formatRational(rational(-4, 2))).toBe("-2");
  });

  it("refuses a zero denominator and division by zero", () => {
    expect(() => rational(1n, 0n)).toThrow(RangeError);
    expect(() => div(ONE, ZERO)).toThrow(RangeError);
  });

  it("does not mutate its inputs", () => {
    const a = rational(2n, 3n);
    const b = rational(5n, 7n);
    mul(a, b);
    add(a, b);
    expect(a).toEqual({ num: 2n, den: 3n });
    expect(b).toEqual({ num: 5n, den: 7n });
  });
});
