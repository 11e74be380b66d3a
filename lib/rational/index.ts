/** Exact rationals on BigInt: the only number type the core uses for matrix entries. */
export type { Rational } from "./rational";
export { rational, gcd, ZERO, ONE } from "./rational";
export { add, sub, mul, div, neg, compare, equals, isZero } from "./arithmetic";
export { parseRational, RationalSyntaxError } from "./parseRational";
export { formatRational } from "./formatRational";
export { rationalDigits } from "./rationalDigits";
export type { RationalDigits } from "./rationalDigits";
