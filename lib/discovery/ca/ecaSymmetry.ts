/**
 * The two ECA symmetries on rule numbers (common practice; DOMAIN.md §4), kept inside the search so that
 * the search can prune by them. Results transported by them are re-verified by the core's checker.
 */

/** Left–right reflection: neighbourhood (a, b, c) becomes (c, b, a). */
export function reflectEca(rule: number): number {
  let out = 0;
  for (let m = 0; m < 8; m++) {
    if ((rule >> m) & 1) out |= 1 << (((m & 1) << 2) | (m & 2) | (m >> 2));
  }
  return out;
}

/** 0↔1 complement of inputs and output. */
export function complementEca(rule: number): number {
  let out = 0;
  for (let m = 0; m < 8; m++) {
    if (!((rule >> (7 - m)) & 1)) out |= 1 << m;
  }
  return out;
}

/** Smallest rule number among the (up to four) rules equivalent to `rule`. */
export function ecaClassRepresentative(rule: number): number {
  const r = reflectEca(rule);
  return Math.min(rule, r, complementEca(rule), complementEca(r));
}

/** Reverse the order of the N cells of a block state (cell 0 is the most significant bit). */
export function reverseBlock(state: number, block: number): number {
  let out = 0;
  for (let i = 0; i < block; i++) out |= ((state >> i) & 1) << (block - 1 - i);
  return out;
}
