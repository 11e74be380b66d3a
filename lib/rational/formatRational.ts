import type { Rational } from "./rational";

/** "p/q" in lowest terms, or "p" when the denominator is 1 (DOMAIN.md §1). */
export function formatRational(r: Rational): string {
  return r.den === 1n ? r.num.toString() : `${r.num}/${r.den}`;
}
