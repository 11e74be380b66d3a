/**
 * A 1-D CA rule: alphabet k, radius r, and table[i] = new centre value for the neighbourhood whose
 * cells, read as a base-k number with the leftmost cell most significant, equal i (DOMAIN.md §1).
 */
export type RuleTable = { k: number; r: number; table: Uint8Array };

/** Raised for a rule table, block size or projection that breaks the encodings of DOMAIN.md §1. */
export class CaInputError extends Error {
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(`${field}: ${message}`);
    this.name = "CaInputError";
  }
}

/** Largest table the core will build in memory (entries); callers enforce their own, smaller limits first. */
export const MAX_TABLE_ENTRIES = 2 ** 26;

export function neighbourhoodCount(k: number, r: number): number {
  return k ** (2 * r + 1);
}

export function assertRuleTable(t: RuleTable): void {
  if (!Number.isInteger(t.k) || t.k < 2 || t.k > 256) throw new CaInputError("k", `alphabet size must be an integer in 2..256, got ${t.k}`);
  if (!Number.isInteger(t.r) || t.r < 1) throw new CaInputError("r", `radius must be a positive integer, got ${t.r}`);
  const size = neighbourhoodCount(t.k, t.r);
  if (size > MAX_TABLE_ENTRIES) throw new CaInputError("table", `k^(2r+1) = ${size} entries is more than ${MAX_TABLE_ENTRIES}`);
  if (t.table.length !== size) throw new CaInputError("table", `expected ${size} entries (k^(2r+1)), got ${t.table.length}`);
  for (let i = 0; i < size; i++)
    if (t.table[i] >= t.k) throw new CaInputError("table", `entry ${i} is ${t.table[i]}, outside the alphabet 0..${t.k - 1}`);
}

/** Wolfram code: the new centre for (a, b, c) is bit 4a + 2b + c of the rule number (Wolfram 1983). */
export function ecaTable(rule: number): RuleTable {
  if (!Number.isInteger(rule) || rule < 0 || rule > 255) throw new CaInputError("rule", `an ECA rule number is an integer in 0..255, got ${rule}`);
  const table = new Uint8Array(8);
  for (let i = 0; i < 8; i++) table[i] = (rule >> i) & 1;
  return { k: 2, r: 1, table };
}

/** The Wolfram code of a k = 2, r = 1 table, or null for any other CA. */
export function ecaRuleOf(t: RuleTable): number | null {
  if (t.k !== 2 || t.r !== 1 || t.table.length !== 8) return null;
  let rule = 0;
  for (let i = 0; i < 8; i++) rule |= (t.table[i] & 1) << i;
  return rule;
}

/** Radius of the block-N supercell CA after T steps of a radius-r rule: R = ceil(rT / N) (DOMAIN.md §2). */
export function supercellRadius(r: number, N: number, T: number): number {
  return Math.ceil((r * T) / N);
}
