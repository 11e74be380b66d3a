/**
 * The flat pass of the on-demand projection search, bit-sliced: 32 consecutive windows per 32-bit word.
 *
 * Output cell j of window w is cone(pattern_j(w)) with pattern_j(w) = (w >>> s_j) & mask. Over 32 consecutive
 * windows starting at a multiple of 32, pattern_j takes 32 >>> s_j consecutive values, each 2^s_j times (or one
 * value when s_j ≥ 5), so the word of that output cell across the 32 windows is a run of bits of the cone's
 * level-T table packed as bits, spread. The projection of the image block is then a mux tree over the N cell words
 * (the table of p as constant words), and each group of windows sharing their coarse prefix is compared with g at
 * once (bitSlices.ts).
 */

import { WORD, applyTable, spreadRun, tableScratchLength } from "./bitSlices";
import type { ConeWords } from "./lightCone";

const WORD_STRIDE = 0x2d5;

/** The coarse prefix's expected segment of projected images, −1 while a bit of g it needs is unknown. */
function expectedSegment(g0: number, g1: number, m0: number, m1: number): number {
  return g0 < 0 || g1 < 0 ? -1 : (g0 ? m0 : 0) | (g1 ? m1 : 0);
}

export class SlicedWindowCheck {
  private readonly n: number;
  private readonly groups: number;
  private readonly values: Int32Array;
  private readonly cells: Int32Array;
  /** p's table packed as bits (at most 16 block states: one word) */
  private readonly pBits = new Int32Array(1);
  /** per coarse prefix (the first width − 1 coarse cells): the expected segment, as expectedSegment gives it */
  private readonly expect: Int32Array;
  /**
   * Where the groups of a word share all blocks but the last two's low bits (2^N ≥ 32 / 2^N, i.e. N ≥ 3), the
   * word's expected images depend only on the coarse upper blocks and the high bits of the second-to-last block:
   * per such key, the word once every group in it has met g.
   */
  private readonly wordsShareUpper: boolean;
  private readonly wordExpect: Int32Array;
  private readonly wordKnown: Uint8Array;

  constructor(
    private readonly cone: ConeWords,
    private readonly block: number,
    private readonly width: number,
    private readonly coneShift: Int32Array,
    private readonly coneMask: number,
  ) {
    this.n = 2 ** block;
    this.groups = WORD / this.n;
    this.values = new Int32Array(tableScratchLength(block));
    this.cells = new Int32Array(block);
    this.expect = new Int32Array(2 ** (width - 1));
    this.wordsShareUpper = this.groups <= this.n && width >= 3;
    const keys = this.wordsShareUpper ? 2 ** (width - 2) * (this.n / this.groups) : 0;
    this.wordExpect = new Int32Array(keys);
    this.wordKnown = new Uint8Array(keys);
  }

  /** Whether the words line up: at least 32 windows and cone patterns, and whole blocks of windows per word. */
  static applies(block: number, width: number, coneMask: number): boolean {
    return block >= 1 && 2 ** block <= WORD / 2 && width * block >= 5 && coneMask + 1 >= WORD;
  }

  /** The projection of the image block across the 32 windows from w0: a mux tree over the output cell words. */
  private projectedImages(w0: number): number {
    const { block, cells, values, coneShift, coneMask, cone } = this;
    for (let j = 0; j < block; j++) {
      const s = coneShift[j];
      const start = (w0 >>> s) & coneMask;
      cells[j] = spreadRun(cone.word(start >>> 5), start, s);
    }
    return applyTable(cells, block, this.pBits, values);
  }

  /**
   * The windows of coarse window c: `part` holds their projected images among the windows `m` of the word's
   * group; they must agree with each other and with g[c] (set here if unset).
   */
  private settle(g: Int8Array, trail: number[], gSetKind: number, c: number, part: number, m: number): boolean {
    if (m === 0) return true;
    const value = part === 0 ? 0 : part === m ? 1 : -1;
    if (value < 0) return false;
    if (g[c] < 0) {
      g[c] = value;
      trail.push(gSetKind, c);
      return true;
    }
    return g[c] === value;
  }

  /**
   * Every window against the complete projection p: false at the first coarse window whose windows disagree
   * (with each other or with g); otherwise bits of g still unset are set, each pushed on the trail as (kind, c).
   * A group of windows sharing their coarse prefix is one comparison with its expected segment once both bits of
   * g it meets are known.
   */
  check(p: Int8Array, g: Int8Array, trail: number[], gSetKind: number): boolean {
    const { n, block, width, groups, expect, wordExpect, wordKnown } = this;
    let m1 = 0;
    for (let x = 0; x < n; x++) if (p[x]) m1 |= 1 << x;
    const segMask = (1 << n) - 1;
    const m0 = segMask & ~m1;
    this.pBits[0] = m1;
    for (let prefix = 0; prefix < expect.length; prefix++) expect[prefix] = expectedSegment(g[2 * prefix], g[2 * prefix + 1], m0, m1);
    wordKnown.fill(0);
    const stateMask = n - 1;
    // integer bounds (2 ** … is a double, and slows every comparison with it)
    const words = 1 << (width * block - 5);
    const groupBits = 31 - Math.clz32(groups);
    let upperOf = -1;
    let upper = 0;
    for (let q = 0; q < words; q++) {
      // an odd stride spreads the words: a near miss's conflicts sit together in counting order (they share blocks)
      const w0 = (Math.imul(q, WORD_STRIDE) & (words - 1)) << 5;
      const images = this.projectedImages(w0);
      const high0 = w0 >>> block;
      if (this.wordsShareUpper) {
        // the word's groups share their upper blocks (N ≥ 3): once each group has met g, the word is one comparison
        if (high0 >>> block !== upperOf) {
          upperOf = high0 >>> block;
          upper = this.upperCoarse(p, upperOf);
        }
        const key = (upper << (block - groupBits)) | ((high0 & stateMask) >>> groupBits);
        if (wordKnown[key]) {
          if (images !== wordExpect[key]) return false;
          continue;
        }
      }
      let whole = 0;
      for (let h = 0; h < groups; h++) {
        const high = high0 + h;
        if (high >>> block !== upperOf) {
          upperOf = high >>> block;
          upper = this.upperCoarse(p, upperOf);
        }
        const prefix = (upper << 1) | p[high & stateMask];
        const segment = (images >>> (h * n)) & segMask;
        const expected = expect[prefix];
        if (segment !== expected) {
          if (expected >= 0) return false;
          const c = prefix << 1;
          if (!this.settle(g, trail, gSetKind, c, segment & m0, m0) || !this.settle(g, trail, gSetKind, c | 1, segment & m1, m1)) return false;
          expect[prefix] = expectedSegment(g[c], g[c | 1], m0, m1);
        }
        whole |= segment << (h * n);
      }
      if (this.wordsShareUpper) {
        const key = (upper << (block - groupBits)) | ((high0 & stateMask) >>> groupBits);
        wordExpect[key] = whole;
        wordKnown[key] = 1;
      }
    }
    return true;
  }

  /** The coarse cells (p of each block) of the width − 2 blocks of `upperOf`, first block most significant. */
  private upperCoarse(p: Int8Array, upperOf: number): number {
    const { block, width } = this;
    const stateMask = this.n - 1;
    let upper = 0;
    for (let shift = (width - 3) * block; shift >= 0; shift -= block) upper = (upper << 1) | p[(upperOf >>> shift) & stateMask];
    return upper;
  }
}
