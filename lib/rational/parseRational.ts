import type { Rational } from "./rational";
import { rational } from "./rational";

export class RationalSyntaxError extends Error {
  constructor(readonly text: string, reason: string) {
    super(`not an exact rational: ${JSON.stringify(text.length > 40 ? text.slice(0, 40) + "…" : text)} (${reason})`);
    this.name = "RationalSyntaxError";
  }
}

const FRACTION = /^([+-]?)(\d+)(?:\/(\d+))?$/;
/** Decimal with optional exponent, e.g. "0.125", "-.5", "2.5e-3" (the Matrix Market files write reals this way). */
const DECIMAL = /^([+-]?)(\d*)(?:\.(\d*))?(?:[eE]([+-]?\d+))?$/;
const MAX_EXPONENT = 10_000;

/** Parses "p/q", "p", "-p/q" or a decimal such as "0.125" exactly; never goes through floating point. */
export function parseRational(text: string): Rational {
  const s = text.trim();
  const f = FRACTION.exec(s);
  if (f) {
    const den = f[3] === undefined ? 1n : BigInt(f[3]);
    if (den === 0n) throw new RationalSyntaxError(text, "zero denominator");
    const num = BigInt(f[2]);
    return rational(f[1] === "-" ? -num : num, den);
  }
  const d = DECIMAL.exec(s);
  if (!d || (d[2] === "" && (d[3] ?? "") === "")) throw new RationalSyntaxError(text, "expected p/q, an integer or a decimal");
  const frac = d[3] ?? "";
  const exp = d[4] === undefined ? 0 : Number(d[4]);
  if (Math.abs(exp) > MAX_EXPONENT) throw new RationalSyntaxError(text, `exponent beyond ±${MAX_EXPONENT}`);
  let num = BigInt((d[2] || "0") + frac);
  if (d[1] === "-") num = -num;
  const scale = exp - frac.length;
  return scale >= 0 ? rational(num * 10n ** BigInt(scale)) : rational(num, 10n ** BigInt(-scale));
}
