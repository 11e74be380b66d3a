/**
 * f^T of the centre cell of a (2rT+1)-cell pattern (leftmost cell most significant), for a binary rule of radius r:
 * the T-step light cone, kept as bits (pattern i at bit i & 31 of word i >>> 5).
 *
 * The cone of s steps is the rule applied to 2r + 1 overlapping cones of s − 1 steps. Levels below T are small and
 * built whole; level T is built one word (32 patterns) at a time on first use, since a refuted branch of the
 * search needs few of its entries. Where level T − 1 is at least a word long, a word of level T is the rule as a
 * mux tree over 2r + 1 runs of the lower level's bits (bitSlices.ts), about 1.6 ns a pattern against 15 ns for a
 * pattern looked up one by one (measured on random radius-2 rules at T = 3). The buffers are sized by (r, T) and
 * reused for the next rule.
 */
import type { RuleTable } from "@/lib/ca";
import { WORD, bitAt, levelWord, packBits, tableScratchLength } from "./bitSlices";

/** What the bit-sliced flat pass reads of a cone: its level T, a word at a time. */
export interface ConeWords {
  word(q: number): number;
}

export class LightCone implements ConeWords {
  /** level 1 (the rule) and levels 2 … T − 1, as bits */
  private readonly levels: Int32Array[] = [];
  /** level T as bits, word q valid where ready[q] */
  private readonly top: Int32Array;
  private readonly ready: Uint8Array;
  private readonly size: number;
  private readonly below: Int32Array;
  private readonly belowLength: number;
  private readonly span: number;
  private rule: Uint8Array = new Uint8Array(0);
  private readonly inputs: Int32Array;
  private readonly scratch: Int32Array;

  constructor(
    private readonly r: number,
    private readonly steps: number,
  ) {
    this.span = 2 * r + 1;
    for (let s = 1; s < Math.max(steps, 2); s++) this.levels.push(new Int32Array(Math.max(1, this.levelLength(s) / WORD)));
    this.size = this.levelLength(steps);
    this.top = new Int32Array(Math.max(1, this.size / WORD));
    this.ready = new Uint8Array(this.top.length);
    this.below = this.levels[steps > 1 ? steps - 2 : 0];
    this.belowLength = this.levelLength(Math.max(steps - 1, 1));
    this.inputs = new Int32Array(this.span);
    this.scratch = new Int32Array(tableScratchLength(this.span));
  }

  private levelLength(s: number): number {
    return 2 ** (2 * this.r * s + 1);
  }

  /** Takes rule t (of this radius): the levels below T are built, level T is forgotten. */
  load(t: RuleTable): void {
    this.rule = t.table;
    packBits(t.table, this.levels[0]);
    for (let s = 2; s < this.steps; s++) this.buildLevel(this.levels[s - 2], this.levelLength(s - 1), this.levels[s - 1], this.levelLength(s));
    if (this.steps === 1) {
      this.top.set(this.levels[0]);
      this.ready.fill(1);
    } else this.ready.fill(0);
  }

  private buildLevel(lower: Int32Array, lowerLength: number, next: Int32Array, nextLength: number): void {
    if (lowerLength >= WORD) {
      for (let q = 0; q < next.length; q++) next[q] = levelWord(lower, lowerLength, q, this.span, this.levels[0], this.inputs, this.scratch);
      return;
    }
    next.fill(0);
    for (let x = 0; x < nextLength; x++) if (this.apply(lower, lowerLength, x)) next[x >>> 5] |= 1 << (x & 31);
  }

  /** The rule applied to the 2r + 1 overlapping lower patterns of `pattern`. */
  private apply(lower: Int32Array, lowerLength: number, pattern: number): number {
    const mask = lowerLength - 1;
    let idx = 0;
    for (let shift = this.span - 1; shift >= 0; shift--) idx = (idx << 1) | bitAt(lower, (pattern >>> shift) & mask);
    return this.rule[idx];
  }

  /** Word q of level T: patterns 32q … 32q + 31 (fewer when the level is shorter than a word). */
  word(q: number): number {
    if (this.ready[q]) return this.top[q];
    this.ready[q] = 1;
    if (this.belowLength >= WORD) return (this.top[q] = levelWord(this.below, this.belowLength, q, this.span, this.levels[0], this.inputs, this.scratch));
    let word = 0;
    for (let i = 0; i < WORD && q * WORD + i < this.size; i++) word |= this.apply(this.below, this.belowLength, q * WORD + i) << i;
    return (this.top[q] = word);
  }

  /** Level T at one pattern. */
  cell(pattern: number): number {
    return (this.word(pattern >>> 5) >>> (pattern & 31)) & 1;
  }
}
