import { gcd, type Rational } from "@/lib/rational";
import { MatrixInputError, identityMatrix, type Matrix } from "./matrix";

/** Integers over one common denominator: the value of entry (i, j) is num[i][j] / den. */
type Scaled = { num: bigint[][]; den: bigint };

/**
 * P^k by repeated squaring. The matrix is kept as integers over one common denominator D, so no gcd is
 * taken while squaring; at the end every entry is reduced. Since the final denominator divides D^k, its
 * prime factors all divide D, and the reduction only needs gcds against the small D (see reduceOver).
 */
export function matrixPower(p: Matrix, k: number): Matrix {
  if (!Number.isSafeInteger(k) || k < 0) throw new MatrixInputError("steps", `the exponent must be a non-negative integer, got ${k}`);
  const n = p.length;
  if (k === 0) return identityMatrix(n);
  const base = toScaled(p);
  let square = base;
  let result: Scaled | null = null;
  for (let e = k; e > 0; e = Math.floor(e / 2)) {
    if (e % 2 === 1) result = result === null ? square : multiply(result, square);
    if (e > 1) square = multiply(square, square);
  }
  const out = result as Scaled;
  const factors = knownFactors(base.den);
  return out.num.map((row) => row.map((x) => reduceOver(x, out.den, base.den, factors)));
}

function toScaled(p: Matrix): Scaled {
  let den = 1n;
  for (const row of p) for (const x of row) den = (den / gcd(den, x.den)) * x.den;
  return { num: p.map((row) => row.map((x) => x.num * (den / x.den))), den };
}

function multiply(a: Scaled, b: Scaled): Scaled {
  const n = a.num.length;
  const num: bigint[][] = [];
  for (let i = 0; i < n; i++) {
    const row = new Array<bigint>(n).fill(0n);
    const ai = a.num[i];
    for (let l = 0; l < n; l++) {
      const x = ai[l];
      if (x === 0n) continue;
      const bl = b.num[l];
      for (let j = 0; j < n; j++) if (bl[j] !== 0n) row[j] += x * bl[j];
    }
    num.push(row);
  }
  return { num, den: a.den * b.den };
}

type Factor = { p: bigint; chunk: bigint };

/** Prime factors of D below 10^5 (with the largest power of each below 2^52, divided out in one step), and any cofactor. */
function knownFactors(d: bigint): Factor[] {
  const factors: Factor[] = [];
  const add = (p: bigint) => {
    let chunk = p;
    while (chunk * p < 2n ** 52n) chunk *= p;
    factors.push({ p, chunk });
  };
  for (let p = 2n; p < 100_000n && p * p <= d; p += p === 2n ? 1n : 2n) {
    if (d % p !== 0n) continue;
    add(p);
    while (d % p === 0n) d /= p;
  }
  if (d > 1n) add(d);
  return factors;
}

/**
 * num/den in lowest terms when every prime factor of den divides `small`. Known factors of `small` are
 * divided out first, many at a time (division by a one-limb number is cheap). Then, since any common prime
 * of num and den divides gcd(num, den, small), dividing out that gcd until it is 1 leaves the fraction
 * reduced whatever the factors were; every gcd is taken against `small`, never between two huge numbers.
 */
function reduceOver(num: bigint, den: bigint, small: bigint, factors: Factor[]): Rational {
  if (num === 0n) return { num: 0n, den: 1n };
  for (const { p, chunk } of factors) {
    while (num % chunk === 0n && den % chunk === 0n) {
      num /= chunk;
      den /= chunk;
    }
    while (num % p === 0n && den % p === 0n) {
      num /= p;
      den /= p;
    }
  }
  for (;;) {
    const g = gcd(num % small, gcd(den % small, small));
    if (g === 1n) return { num, den };
    num /= g;
    den /= g;
  }
}
