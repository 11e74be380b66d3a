/**
 * The totalistic code of a three-state radius-1 rule (DOMAIN.md §2b, common practice), or null when the rule is not
 * totalistic: the new value must depend only on s = x₋₁ + x₀ + x₁ ∈ {0..6}, and then c = Σ_s v(s)·3^s (the value for
 * sum s is base-3 digit s of c, digit 0 least significant). The inverse of the discovery atlas's `totalisticTable`.
 */
export function totalisticCode(rule: { k: number; r: number; table: ArrayLike<number> }): number | null {
  if (rule.k !== 3 || rule.r !== 1 || rule.table.length !== 27) return null;
  const value = new Array<number>(7).fill(-1);
  for (let i = 0; i < 27; i++) {
    const s = Math.floor(i / 9) + (Math.floor(i / 3) % 3) + (i % 3);
    const v = rule.table[i];
    if (!Number.isInteger(v) || v < 0 || v > 2) return null;
    if (value[s] === -1) value[s] = v;
    else if (value[s] !== v) return null;
  }
  return value.reduce((code, v, s) => code + v * 3 ** s, 0);
}
