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
  fill(pattern: number): number;
}

const WORD = 32;

/** spread[s][b]: each of the 8 bits of byte b repeated 2^s times (bits beyond 32 dropped). */
const SPREAD: Int32Array[] = Array.from({ length: 5 }, (_, s) =>
  Int32Array.from({ length: 256 }, (_, b) => {
    let word = 0;
    const run = 2 ** s;
    for (let k = 0; k < 8 && k * run < WORD; k++) if ((b >>> k) & 1) word |= (run === WORD ? -1 : ((1 << run) - 1)) << (k * run);
    return word;
  }),
);

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
    const { top } = this.cone;
    const bits = new Int32Array((this.coneMask + 1) / WORD);
    for (let i = 0; i <= this.coneMask; i++) {
      const cell = top[i] >= 0 ? top[i] : this.cone.fill(i);
      if (cell) bits[i >>> 5] |= 1 << (i & 31);
    }
    return (this.topBits = bits);
  }

  /** Output cell j across the 32 windows from w0 (a multiple of 32), as a word. */
  private cellWord(bits: Int32Array, w0: number, s: number): number {
    const start = (w0 >>> s) & this.coneMask;
    const word = bits[start >>> 5];
    if (s === 0) return word;
    if (s >= 5) return -((word >>> (start & 31)) & 1);
    const run = (word >>> (start & 31)) & ((1 << (WORD >>> s)) - 1);
    if (s === 1) return SPREAD[1][run & 255] | (SPREAD[1][run >>> 8] << 16);
    return SPREAD[s][run];
  }

  /** The projection of the image block across the 32 windows from w0: a mux tree over the cell words. */
  private projectedImages(bits: Int32Array, w0: number, pWords: Int32Array): number {
    const { block, cells, values, coneShift } = this;
    for (let j = 0; j < block; j++) cells[j] = this.cellWord(bits, w0, coneShift[j]);
    values.set(pWords);
    for (let j = block - 1, len = this.n; j >= 0; j--, len >>>= 1) {
      const d = cells[j];
      for (let k = 0; k < len >>> 1; k++) values[k] = (d & values[2 * k + 1]) | (~d & values[2 * k]);
    }
    return values[0];
  }

  /**
   * Every window against the complete projection p: false at the first coarse window whose windows disagree
   * (with each other or with g); otherwise bits of g still unset are set, each pushed on the trail as (kind, c).
   */
  check(p: Int8Array, g: Int8Array, trail: number[], gSetKind: number): boolean {
    const { n, block, width, groups } = this;
    const bits = this.bits();
    const pWords = Int32Array.from(p, (v) => -v);
    const xMask = [0, 0];
    for (let x = 0; x < n; x++) xMask[p[x]] |= 1 << x;
    const segMask = (1 << n) - 1;
    const stateMask = n - 1;
    const windows = 2 ** (width * block);
    for (let w0 = 0; w0 < windows; w0 += WORD) {
      const images = this.projectedImages(bits, w0, pWords);
      for (let h = 0; h < groups; h++) {
        const high = (w0 >>> block) + h;
        let prefix = 0;
        for (let shift = (width - 2) * block; shift >= 0; shift -= block) prefix = (prefix << 1) | p[(high >>> shift) & stateMask];
        const segment = (images >>> (h * n)) & segMask;
        for (let b = 0; b < 2; b++) {
          const m = xMask[b];
          if (m === 0) continue;
          const part = segment & m;
          const value = part === 0 ? 0 : part === m ? 1 : -1;
          if (value < 0) return false;
          const c = (prefix << 1) | b;
          if (g[c] < 0) {
            g[c] = value;
            trail.push(gSetKind, c);
          } else if (g[c] !== value) return false;
        }
      }
    }
    return true;
  }
}
