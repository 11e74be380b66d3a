/**
 * Bit-sliced evaluation of a CA's light cone: 32 patterns per 32-bit word, a table's entries packed as bits (entry
 * i at bit i & 31 of word i >>> 5), a boolean function applied to words as a mux tree of its truth table.
 * Bit-slicing is common practice for evaluating boolean functions over many inputs in parallel.
 */

export const WORD = 32;

/** spread[s][b]: each of the 8 bits of byte b repeated 2^s times (bits beyond 32 dropped). */
const SPREAD: Int32Array[] = Array.from({ length: 5 }, (_, s) =>
  Int32Array.from({ length: 256 }, (_, b) => {
    let word = 0;
    const run = 2 ** s;
    for (let k = 0; k < 8 && k * run < WORD; k++) if ((b >>> k) & 1) word |= (run === WORD ? -1 : ((1 << run) - 1)) << (k * run);
    return word;
  }),
);

/**
 * Bits start … start + (32 >>> s) − 1 of a bit table, each repeated 2^s times, as a word (one bit, repeated, when
 * s ≥ 5); `word` is the table's word holding bit `start`. For the 32 windows from w0 (a multiple of 32), pattern
 * (w >>> s) & mask runs through exactly these values, starting at start = (w0 >>> s) & mask.
 */
export function spreadRun(word: number, start: number, s: number): number {
  if (s === 0) return word;
  if (s >= 5) return -((word >>> (start & 31)) & 1);
  const run = (word >>> (start & 31)) & ((1 << (WORD >>> s)) - 1);
  if (s === 1) return SPREAD[1][run & 255] | (SPREAD[1][run >>> 8] << 16);
  return SPREAD[s][run];
}

/** Bit (w >>> s) & mask of `bits` for the 32 values w0 … w0 + 31 (w0 a multiple of 32, mask + 1 ≥ 32), as a word. */
export function runWord(bits: Int32Array, mask: number, w0: number, s: number): number {
  const start = (w0 >>> s) & mask;
  return spreadRun(bits[start >>> 5], start, s);
}

/** Scratch words applyTable needs for a truth table of 2^count entries. */
export function tableScratchLength(count: number): number {
  return 16 + Math.max(1, (1 << count) >>> 2);
}

/** The function of two words (minterms m0 … m3, in index order 00, 01, 10, 11) whose four table entries are c's bits. */
function quad(c: number, m0: number, m1: number, m2: number, m3: number): number {
  return (m0 & -(c & 1)) | (m1 & -((c >>> 1) & 1)) | (m2 & -((c >>> 2) & 1)) | (m3 & -((c >>> 3) & 1));
}

/**
 * The boolean function with truth table `table` (packed as bits; the index's bits from `inputs[0]`, most
 * significant) applied bitwise to the words `inputs[0 … count − 1]`. The two least significant inputs are taken
 * together: each group of four entries of the table is one function of them, built from their four minterms (for
 * larger tables, all 16 are built once and looked up); the remaining inputs are a mux tree. For five inputs that
 * is 16 + 8 lookups + 7 muxes instead of a plain mux tree's 31 muxes. Loop bounds stay small integers (a bound
 * from `**` made this ten times slower).
 */
export function applyTable(inputs: Int32Array, count: number, table: Int32Array, scratch: Int32Array): number {
  const t = table[0];
  if (count === 1) {
    const d = inputs[0];
    return (~d & -(t & 1)) | (d & -((t >>> 1) & 1));
  }
  const e = inputs[count - 2];
  const d = inputs[count - 1];
  const m0 = ~e & ~d;
  const m1 = ~e & d;
  const m2 = e & ~d;
  const m3 = e & d;
  if (count === 2) return quad(t, m0, m1, m2, m3);
  if (count === 3) {
    const x = inputs[0];
    return (x & quad(t >>> 4, m0, m1, m2, m3)) | (~x & quad(t, m0, m1, m2, m3));
  }
  scratch[0] = 0;
  scratch[1] = m0;
  scratch[2] = m1;
  scratch[3] = m0 | m1;
  scratch[4] = m2;
  scratch[8] = m3;
  for (let c = 5; c < 8; c++) scratch[c] = m2 | scratch[c - 4];
  for (let c = 9; c < 16; c++) scratch[c] = m3 | scratch[c - 8];
  let len = (1 << count) >>> 2;
  for (let k = 0; k < len; k++) scratch[16 + k] = scratch[(table[k >>> 3] >>> ((k & 7) << 2)) & 15];
  for (let j = count - 3; j >= 0; j--) {
    const x = inputs[j];
    len >>>= 1;
    for (let k = 0; k < len; k++) scratch[16 + k] = (x & scratch[17 + 2 * k]) | (~x & scratch[16 + 2 * k]);
  }
  return scratch[16];
}

/** Entry i of a table packed as bits. */
export function bitAt(bits: Int32Array, i: number): number {
  return (bits[i >>> 5] >>> (i & 31)) & 1;
}

/** A 0/1 table packed as bits into `out` (at least ceil(length / 32) words). */
export function packBits(table: ArrayLike<number>, out: Int32Array): Int32Array {
  out.fill(0);
  for (let i = 0; i < table.length; i++) if (table[i]) out[i >>> 5] |= 1 << (i & 31);
  return out;
}

/**
 * Word q of the cone one step taller than `lower` (a level of `lowerLength` ≥ 32 patterns, as bits): each of its 32
 * patterns is the rule (`rule`, as bits) applied to 2r + 1 overlapping lower patterns, whose bits over the word
 * are runs of `lower`. `inputs` holds span words, `scratch` tableScratchLength(span).
 */
export function levelWord(lower: Int32Array, lowerLength: number, q: number, span: number, rule: Int32Array, inputs: Int32Array, scratch: Int32Array): number {
  for (let d = 0; d < span; d++) inputs[d] = runWord(lower, lowerLength - 1, q * WORD, span - 1 - d);
  return applyTable(inputs, span, rule, scratch);
}
