/**
 * The flat pass of the on-demand projection search, bit-sliced: 32 consecutive windows per 32-bit word.
 *
 * Output cell j of window w is cone(pattern_j(w)) with pattern_j(w) = (w >>> s_j) & mask. Over 32 consecutive
 * windows starting at a multiple of 32, pattern_j takes 32 >>> s_j consecutive values, each 2^s_j times (or one
 * value when s_j ≥ 5), so the word of that output cell across the 32 windows is a run of bits of the cone's
 * level-T table packed as bits, spread. The projection of the image block is then a mux tree over the N cell words
 * (the table of p as constant words), and each group of windows sharing their coarse prefix is compared with g at
 * once. Bit-slicing is common practice for evaluating boolean functions over many inputs in parallel.
 */

/** The T-step light cone as the search keeps it: level T filled on demand (−1 where not yet computed). */
export interface ConeTable {
  readonly top: Int8Array;
  /** level T − 1, whole */
  readonly below: Uint8Array;
  /** the fine rule's table and its window (2r + 1 cells) */
  readonly rule: Uint8Array;
  readonly span: number;
  fill(pattern: number): number;
}

const WORD = 32;
const WORD_STRIDE = 0x2d5;

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
 * Bit (w >>> s) & mask of `bits` for the 32 values w0 … w0 + 31 (w0 a multiple of 32, mask + 1 ≥ 32), as a word:
 * a run of 32 >>> s consecutive bits, each repeated 2^s times.
 */
function runWord(bits: Int32Array, mask: number, w0: number, s: number): number {
  const start = (w0 >>> s) & mask;
  const word = bits[start >>> 5];
  if (s === 0) return word;
  if (s >= 5) return -((word >>> (start & 31)) & 1);
  const run = (word >>> (start & 31)) & ((1 << (WORD >>> s)) - 1);
  if (s === 1) return SPREAD[1][run & 255] | (SPREAD[1][run >>> 8] << 16);
  return SPREAD[s][run];
}

/**
 * The boolean function with truth table `table` (constant words, 0 or −1; index bits from `inputs[0]`, most
 * significant) applied bitwise to the words `inputs[0 … count − 1]`: a mux tree, least significant input first,
 * with `scratch` (half the table's length at least) for the levels above the first.
 */
function muxTree(inputs: Int32Array, count: number, table: Int32Array, scratch: Int32Array): number {
  let d = inputs[count - 1];
  let len = table.length >>> 1;
  for (let k = 0; k < len; k++) scratch[k] = (d & table[2 * k + 1]) | (~d & table[2 * k]);
  for (let j = count - 2; j >= 0; j--) {
    d = inputs[j];
    len >>>= 1;
    for (let k = 0; k < len; k++) scratch[k] = (d & scratch[2 * k + 1]) | (~d & scratch[2 * k]);
  }
  return scratch[0];
}

/** A table of 0/1 entries (length a multiple of 32) packed as bits, entry i at bit i & 31 of word i >>> 5. */
function packBits(table: ArrayLike<number>): Int32Array {
  const bits = new Int32Array(table.length / WORD);
  for (let i = 0; i < table.length; i++) if (table[i]) bits[i >>> 5] |= 1 << (i & 31);
  return bits;
}

/**
 * Level T of the cone as bits from level T − 1, 32 patterns per word: the 2r + 1 overlapping level-(T − 1)
 * patterns of 32 consecutive level-T patterns are runs of the lower table, and the rule is a mux tree over them.
 */
function nextLevelBits(below: Uint8Array, rule: Uint8Array, span: number, size: number): Int32Array {
  const lower = packBits(below);
  const mask = below.length - 1;
  const ruleWords = new Int32Array(rule.length);
  for (let i = 0; i < rule.length; i++) ruleWords[i] = -rule[i];
  const scratch = new Int32Array(ruleWords.length);
  const inputs = new Int32Array(span);
  const bits = new Int32Array(size / WORD);
  for (let q = 0; q < bits.length; q++) {
    for (let d = 0; d < span; d++) inputs[d] = runWord(lower, mask, q * WORD, span - 1 - d);
    bits[q] = muxTree(inputs, span, ruleWords, scratch);
  }
  return bits;
}

export class SlicedWindowCheck {
  /** level T of the cone as bits, built once the first complete assignment reaches the flat pass */
  private topBits: Int32Array | null = null;
  private readonly n: number;
  private readonly groups: number;
  private readonly values: Int32Array;
  private readonly cells: Int32Array;

  constructor(
    private readonly cone: ConeTable,
    private readonly block: number,
    private readonly width: number,
    private readonly coneShift: Int32Array,
    private readonly coneMask: number,
  ) {
    this.n = 2 ** block;
    this.groups = WORD / this.n;
    this.values = new Int32Array(this.n);
    this.cells = new Int32Array(block);
  }

  /** Whether the words line up: at least 32 windows and cone patterns, and whole blocks of windows per word. */
  static applies(block: number, width: number, coneMask: number): boolean {
    return block >= 1 && 2 ** block <= WORD / 2 && width * block >= 5 && coneMask + 1 >= WORD;
  }

  private bits(): Int32Array {
    if (this.topBits) return this.topBits;
    const { top, below, rule, span } = this.cone;
    const size = this.coneMask + 1;
    if (below.length >= WORD && size === below.length * 2 ** (span - 1)) return (this.topBits = nextLevelBits(below, rule, span, size));
    return (this.topBits = packBits(Int8Array.from(top, (cell, i) => (cell >= 0 ? cell : this.cone.fill(i)))));
  }

  /** The projection of the image block across the 32 windows from w0: a mux tree over the output cell words. */
  private projectedImages(bits: Int32Array, w0: number, pWords: Int32Array): number {
    const { block, cells, values, coneShift, coneMask } = this;
    for (let j = 0; j < block; j++) cells[j] = runWord(bits, coneMask, w0, coneShift[j]);
    return muxTree(cells, block, pWords, values);
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
   */
  check(p: Int8Array, g: Int8Array, trail: number[], gSetKind: number): boolean {
    const { n, block, width, groups } = this;
    const bits = this.bits();
    const pWords = new Int32Array(n);
    for (let x = 0; x < n; x++) pWords[x] = -p[x];
    const xMask = [0, 0];
    for (let x = 0; x < n; x++) xMask[p[x]] |= 1 << x;
    const segMask = (1 << n) - 1;
    const stateMask = n - 1;
    const windows = 2 ** (width * block);
    const [m0, m1] = xMask;
    let upperOf = -1;
    let upper = 0;
    const words = windows / WORD;
    for (let q = 0; q < words; q++) {
      // an odd stride spreads the words: a near miss's conflicts sit together in counting order (they share blocks)
      const w0 = (Math.imul(q, WORD_STRIDE) & (words - 1)) * WORD;
      const images = this.projectedImages(bits, w0, pWords);
      for (let h = 0; h < groups; h++) {
        const high = (w0 >>> block) + h;
        if (high >>> block !== upperOf) {
          upperOf = high >>> block;
          upper = 0;
          for (let shift = (width - 3) * block; shift >= 0; shift -= block) upper = (upper << 1) | p[(upperOf >>> shift) & stateMask];
        }
        const prefix = ((upper << 1) | p[high & stateMask]) << 1;
        const segment = (images >>> (h * n)) & segMask;
        if (!this.settle(g, trail, gSetKind, prefix, segment & m0, m0) || !this.settle(g, trail, gSetKind, prefix | 1, segment & m1, m1)) return false;
      }
    }
    return true;
  }
}
