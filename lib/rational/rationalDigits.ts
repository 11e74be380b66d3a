/** Decimal digits of the numerator and denominator a rational's text stands for, before any reduction. */
export type RationalDigits = { num: number; den: number };

const FRACTION = /^\s*[+-]?0*(\d*)(?:\/0*(\d*))?\s*$/;
const DECIMAL = /^\s*[+-]?(\d*)(?:\.(\d*))?(?:[eE]([+-]?\d+))?\s*$/;

/**
 * Counts digits on the text alone (no BigInt, no gcd), so that a bound can be checked before any
 * arithmetic: "12/0340" has 2 and 3, "0.125" stands for 125/1000 (3 and 4), "2.5e-3" for 25/10^4.
 * An exponent beyond 10^9 counts as Infinity. Returns null for text that is not a rational at all
 * (parseRational then says why).
 */
export function rationalDigits(text: string): RationalDigits | null {
  const f = FRACTION.exec(text);
  if (f) return { num: Math.max(1, f[1].length), den: f[2] === undefined ? 1 : Math.max(1, f[2].length) };
  const d = DECIMAL.exec(text);
  if (!d || (d[1] === "" && (d[2] ?? "") === "")) return null;
  const significant = ((d[1] ?? "") + (d[2] ?? "")).replace(/^0+/, "").length;
  const expText = d[3] ?? "0";
  const exp = expText.replace(/^[+-]?0*/, "").length > 9 ? (expText.startsWith("-") ? -Infinity : Infinity) : Number(expText);
  const scale = exp - (d[2] ?? "").length;
  return scale >= 0 ? { num: Math.max(1, significant + scale), den: 1 } : { num: Math.max(1, significant), den: 1 - scale };
}
