/** An exact rational number in lowest terms with a positive denominator. */
export type Rational = { readonly num: bigint; readonly den: bigint };

export function gcd(a: bigint, b: bigint): bigint {
  if (a < 0n) a = -a;
  if (b < 0n) b = -b;
  while (b !== 0n) [a, b] = [b, a % b];
  return a;
}

/** Builds num/den in lowest terms; throws RangeError on a zero denominator. */
export function rational(num: bigint | number, den: bigint | number = 1n): Rational {
  let n = BigInt(num);
  let d = BigInt(den);
  if (d === 0n) throw new RangeError("rational: zero denominator");
  if (d < 0n) {
    n = -n;
    d = -d;
  }
  if (d === 1n) return { num: n, den: 1n };
  const g = gcd(n, d);
  return g === 1n ? { num: n, den: d } : { num: n / g, den: d / g };
}

export const ZERO: Rational = Object.freeze({ num: 0n, den: 1n });
export const ONE: Rational = Object.freeze({ num: 1n, den: 1n });
