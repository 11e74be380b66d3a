import { toDigits, fromDigits, type RuleTable } from "@/lib/ca";

/** Left–right reflection of an ECA: the new rule maps (a, b, c) to the old value at (c, b, a) (common practice). */
export function reflectRule(rule: number): number {
  let out = 0;
  for (let i = 0; i < 8; i++) {
    const mirrored = ((i & 1) << 2) | (i & 2) | ((i >> 2) & 1);
    out |= ((rule >> mirrored) & 1) << i;
  }
  return out;
}

/** 0↔1 complement of an ECA: the new rule maps (a, b, c) to 1 − old(1−a, 1−b, 1−c) (common practice). */
export function complementRule(rule: number): number {
  let out = 0;
  for (let i = 0; i < 8; i++) out |= (1 - ((rule >> (7 - i)) & 1)) << i;
  return out;
}

/** The smallest rule number among f, its reflection, its complement and both. */
export function symmetryClass(rule: number): number {
  return Math.min(rule, reflectRule(rule), complementRule(rule), reflectRule(complementRule(rule)));
}

/** The 256 ECAs grouped into their classes under reflection and complement, by smallest member. */
export function ecaSymmetryClasses(): { representative: number; members: number[] }[] {
  const classes = new Map<number, number[]>();
  for (let rule = 0; rule < 256; rule++) {
    const rep = symmetryClass(rule);
    classes.set(rep, [...(classes.get(rep) ?? []), rule]);
  }
  return [...classes].map(([representative, members]) => ({ representative, members })).sort((a, b) => a.representative - b.representative);
}

/** Reflection of a general rule table: the neighbourhood's cells are read in reverse order. */
export function reflectTable(t: RuleTable): RuleTable {
  const width = 2 * t.r + 1;
  const table = t.table.map((_, i) => t.table[fromDigits(toDigits(i, t.k, width).reverse(), t.k)]);
  return { k: t.k, r: t.r, table };
}

/** Complement of a general rule table: every symbol x becomes k−1−x, in and out. */
export function complementTable(t: RuleTable): RuleTable {
  const last = t.table.length - 1;
  // Complementing every base-k digit of an index i gives the index last − i.
  const table = t.table.map((_, i) => t.k - 1 - t.table[last - i]);
  return { k: t.k, r: t.r, table };
}
