import type { Rational } from "./rational";
import { gcd, rational } from "./rational";

export function add(a: Rational, b: Rational): Rational {
  if (a.den === b.den) return rational(a.num + b.num, a.den);
  return rational(a.num * b.den + b.num * a.den, a.den * b.den);
}

export function sub(a: Rational, b: Rational): Rational {
  return add(a, neg(b));
}

/** Cross-reduces before multiplying so that the final gcd works on small numbers. */
export function mul(a: Rational, b: Rational): Rational {
  if (a.num === 0n || b.num === 0n) return { num: 0n, den: 1n };
  const g1 = gcd(a.num, b.den);
  const g2 = gcd(b.num, a.den);
  return { num: (a.num / g1) * (b.num / g2), den: (a.den / g2) * (b.den / g1) };
}

export function div(a: Rational, b: Rational): Rational {
  if (b.num === 0n) throw new RangeError("rational: division by zero");
  return mul(a, b.num < 0n ? { num: -b.den, den: -b.num } : { num: b.den, den: b.num });
}

export function neg(a: Rational): Rational {
  return { num: -a.num, den: a.den };
}

export function compare(a: Rational, b: Rational): -1 | 0 | 1 {
  const l = a.num * b.den;
  const r = b.num * a.den;
  return l < r ? -1 : l > r ? 1 : 0;
}

export function equals(a: Rational, b: Rational): boolean {
  return a.num === b.num && a.den === b.den;
}

export function isZero(a: Rational): boolean {
  return a.num === 0n;
}
