import { CaInputError } from "./ruleTable";

/**
 * A reproducible pseudo-random row: mulberry32 (a public-domain 32-bit generator, common practice)
 * seeded with `seed`, one draw per cell, so the same seed always gives the same picture.
 */
export function randomRow({ k, width, seed }: { k: number; width: number; seed: number }): Uint8Array {
  if (!Number.isInteger(seed) || seed < 0 || seed > 0xffffffff) throw new CaInputError("seed", `the seed is a whole number in 0..4294967295, got ${seed}`);
  let state = seed >>> 0;
  const row = new Uint8Array(width);
  for (let i = 0; i < width; i++) {
    state = (state + 0x6d2b79f5) >>> 0;
    let z = state;
    z = Math.imul(z ^ (z >>> 15), z | 1);
    z ^= z + Math.imul(z ^ (z >>> 7), z | 61);
    const u = ((z ^ (z >>> 14)) >>> 0) / 4294967296;
    row[i] = Math.floor(u * k);
  }
  return row;
}

/** A row of zeros with one cell of value 1 in the middle (the usual "single seed" start). */
export function singleCellRow(width: number): Uint8Array {
  const row = new Uint8Array(width);
  row[Math.floor(width / 2)] = 1;
  return row;
}

/**
 * A row typed by a person: one digit per cell (0–9, then a–z for larger alphabets); spaces and
 * commas are ignored. Refuses a symbol outside the alphabet, naming its position.
 */
export function parseRow(text: string, k: number): Uint8Array {
  const symbols = text.replace(/[\s,]/g, "").toLowerCase();
  if (symbols.length === 0) throw new CaInputError("initial", "type at least one cell, e.g. 0010110");
  const row = new Uint8Array(symbols.length);
  for (let i = 0; i < symbols.length; i++) {
    const v = parseInt(symbols[i], 36);
    if (Number.isNaN(v) || v >= k) throw new CaInputError("initial", `cell ${i + 1} is “${symbols[i]}”, not a symbol in 0..${(k - 1).toString(36)}`);
    row[i] = v;
  }
  return row;
}
