/**
 * Binary projections of the block-N, T-step supercell of a binary CA of any radius r, without building the
 * supercell table: every p: {0..2^N − 1} → {0,1} with p(0) = 0, using both symbols, such that
 * p(F(X_{-R} … X_R)) = g(p(X_{-R}), …, p(X_R)) for every window (R = ceil(rT / N)), grouped by g.
 *
 * Once the 2R+1 inputs of a window are assigned, its constraint is an equality between two boolean variables:
 * the projection of its image state and one bit of g. So the search is depth-first over p with unit propagation
 * on those equalities, and a window is evaluated (through a memo of the T-step light cone, 2rT+1 cells) only when
 * the last of its inputs is assigned. A refuted branch then costs the few windows over the states assigned so
 * far, instead of the whole table; a complete assignment meets every window exactly once on its path.
 */
import type { RuleTable } from "@/lib/ca";
import { SlicedWindowCheck } from "./slicedWindowCheck";
import { MAX_WIDE_STATES, type WideProjectionClass } from "./wideProjectionSolver";

/** Widest window (in cells) and light cone (in cells) the on-demand search handles; beyond them the table solver is used. */
export const MAX_ON_DEMAND_WINDOW_CELLS = 30;
export const MAX_ON_DEMAND_CONE_CELLS = 24;
/** It lists solutions one by one, like the table solver, so it takes as many block states as that one. */
const MAX_ON_DEMAND_STATES = MAX_WIDE_STATES;

/** Whether the on-demand search handles the binary rule `t` at block N with T steps. */
export function onDemandApplies(t: RuleTable, block: number, steps: number): boolean {
  const R = Math.ceil((t.r * steps) / block);
  return t.k === 2 && 2 ** block <= MAX_ON_DEMAND_STATES && (2 * R + 1) * block <= MAX_ON_DEMAND_WINDOW_CELLS && 2 * t.r * steps + 1 <= MAX_ON_DEMAND_CONE_CELLS;
}

/**
 * f^T of the centre cell of a (2rT+1)-cell pattern (leftmost cell most significant). The cone of s steps is the
 * rule applied to 2r+1 overlapping cones of s − 1 steps: levels below T are small and built whole, level T is
 * filled on first use, since a refuted branch needs few of its entries.
 */
class LightCone {
  /** level T, −1 where not yet computed */
  readonly top: Int8Array;
  /** level T − 1 (for T = 1, the rule itself) */
  readonly below: Uint8Array;
  private readonly belowMask: number;
  readonly span: number;
  readonly rule: Uint8Array;

  constructor(
    private readonly t: RuleTable,
    steps: number,
  ) {
    this.span = 2 * t.r + 1;
    this.rule = t.table;
    let level: Uint8Array = Uint8Array.from(t.table);
    for (let s = 2; s < steps; s++) level = this.nextLevel(level, s);
    this.below = level;
    this.belowMask = level.length - 1;
    this.top = steps === 1 ? Int8Array.from(t.table) : new Int8Array(2 ** (2 * t.r * steps + 1)).fill(-1);
  }

  private nextLevel(level: Uint8Array, s: number): Uint8Array {
    const next = new Uint8Array(2 ** (2 * this.t.r * s + 1));
    const mask = level.length - 1;
    for (let x = 0; x < next.length; x++) {
      let idx = 0;
      for (let shift = this.span - 1; shift >= 0; shift--) idx = (idx << 1) | level[(x >>> shift) & mask];
      next[x] = this.t.table[idx];
    }
    return next;
  }

  /** Computes and stores level T at `pattern`. */
  fill(pattern: number): number {
    const { below, belowMask } = this;
    let idx = 0;
    for (let shift = this.span - 1; shift >= 0; shift--) idx = (idx << 1) | below[(pattern >>> shift) & belowMask];
    return (this.top[pattern] = this.t.table[idx]);
  }
}

/** Windows checked in spread order before the flat pass, and the odd stride that spreads them. */
const CHECK_SAMPLE = 1024;
const SAMPLE_STRIDE = 0x5bd1;

/** Trail entry kinds, for undoing a branch. */
const P_SET = 0;
const G_SET = 1;
const PENDING = 2;
const PROCESSED = 3;

class StopOnDemand extends Error {}

function emptyLists(count: number): number[][] {
  const lists: number[][] = [];
  for (let i = 0; i < count; i++) lists.push([]);
  return lists;
}

class OnDemandSearch {
  readonly n: number;
  readonly width: number;
  readonly p: Int8Array;
  readonly g: Int8Array;
  /** states whose windows have been evaluated, in order */
  readonly processed: Int32Array;
  processedCount = 0;
  /** per bit c of g: image states waiting for it; per state d: bits of g waiting for it; masks avoid repeats */
  readonly waitG: number[][];
  readonly waitP: number[][];
  readonly waitMask: Int32Array;
  readonly trail: number[] = [];
  readonly queue: number[] = [];
  readonly found = new Map<string, WideProjectionClass>();
  private readonly cone: LightCone;
  private readonly coneShift: Int32Array;
  private readonly coneMask: number;
  /** the flat pass 32 windows at a time, where the sizes line up */
  private readonly sliced: SlicedWindowCheck | null;
  private current = 0;

  constructor(
    t: RuleTable,
    readonly block: number,
    readonly steps: number,
    readonly shouldStop: () => boolean,
  ) {
    const R = Math.ceil((t.r * steps) / block);
    this.n = 2 ** block;
    this.width = 2 * R + 1;
    this.p = new Int8Array(this.n).fill(-1);
    this.g = new Int8Array(2 ** this.width).fill(-1);
    this.processed = new Int32Array(this.n);
    // plain loops: Array.from over an array-like with a map function is slow for a search that runs in microseconds
    this.waitG = emptyLists(this.g.length);
    this.waitP = emptyLists(this.n);
    this.waitMask = new Int32Array(this.g.length);
    this.cone = new LightCone(t, steps);
    const cells = this.width * block;
    // output cell j of the centre block is window cell RN + j; its cone ends rT cells to its right
    this.coneShift = new Int32Array(block);
    for (let j = 0; j < block; j++) this.coneShift[j] = cells - 1 - (R * block + j + t.r * steps);
    this.coneMask = 2 ** (2 * t.r * steps + 1) - 1;
    this.sliced = SlicedWindowCheck.applies(block, this.width, this.coneMask) ? new SlicedWindowCheck(this.cone, block, this.width, this.coneShift, this.coneMask) : null;
  }

  /** The centre block after T steps of window w (blocks as N-bit digits, leftmost most significant). */
  image(w: number): number {
    const { cone, coneShift, coneMask } = this;
    const top = cone.top;
    let v = 0;
    for (let j = 0; j < this.block; j++) {
      const pattern = (w >>> coneShift[j]) & coneMask;
      const cell = top[pattern];
      v = (v << 1) | (cell >= 0 ? cell : cone.fill(pattern));
    }
    return v;
  }

  /** assigned states by value, for the clause "some state projects to 1" */
  readonly assigned = [0, 0];

  assign(v: number, value: number): void {
    this.p[v] = value;
    this.assigned[value]++;
    this.trail.push(P_SET, v);
    this.queue.push(v);
  }

  /** Sets bit c of g and settles the image states waiting for it; false on a conflict. */
  setG(c: number, value: number): boolean {
    this.g[c] = value;
    this.trail.push(G_SET, c);
    for (const d of this.waitG[c]) {
      if (this.p[d] < 0) this.assign(d, value);
      else if (this.p[d] !== value) return false;
    }
    return true;
  }

  /** The equality p(image of w) = g(c) of a window whose inputs are all assigned; false on a conflict. */
  window(w: number, c: number): boolean {
    const d = this.image(w);
    const pd = this.p[d];
    const gc = this.g[c];
    if (gc >= 0) {
      if (pd < 0) this.assign(d, gc);
      return pd < 0 || pd === gc;
    }
    if (pd >= 0) return this.setG(c, pd);
    if ((this.waitMask[c] >>> d) & 1) return true;
    this.waitMask[c] |= 1 << d;
    this.waitG[c].push(d);
    this.waitP[d].push(c);
    this.trail.push(PENDING, c * this.n + d);
    return true;
  }

  /** Every window over processed states that contains `current` at least once, from position `pos` on. */
  windowsFrom(pos: number, w: number, c: number, seen: boolean): boolean {
    const { processed, p, block } = this;
    const v = this.current;
    if (pos === this.width - 1) {
      if (!seen) return this.window((w << block) | v, (c << 1) | p[v]);
      for (let i = 0; i < this.processedCount; i++) {
        const s = processed[i];
        if (!this.window((w << block) | s, (c << 1) | p[s])) return false;
      }
      return true;
    }
    for (let i = 0; i < this.processedCount; i++) {
      const s = processed[i];
      if (!this.windowsFrom(pos + 1, (w << block) | s, (c << 1) | p[s], seen || s === v)) return false;
    }
    return true;
  }

  /** Settles the bits of g waiting for v, then evaluates the windows that v completes. */
  process(v: number): boolean {
    const value = this.p[v];
    for (const c of this.waitP[v]) {
      if (this.g[c] < 0) {
        if (!this.setG(c, value)) return false;
      } else if (this.g[c] !== value) return false;
    }
    this.processed[this.processedCount++] = v;
    this.trail.push(PROCESSED, v);
    this.current = v;
    return this.windowsFrom(0, 0, 0, false);
  }

  /**
   * Every window against a complete assignment, in one flat pass: once p is known the search has nothing left to
   * branch on, and a plain loop checks the windows no processed state has reached far faster than the
   * propagation's enumeration would. After the spread sample, where the sizes line up, the loop is bit-sliced
   * (slicedWindowCheck.ts: 32 windows per word, the cone's level T rebuilt whole as bits once per search).
   */
  checkAll(): boolean {
    const { p, g, block, width, trail, cone, coneShift, coneMask } = this;
    const top = cone.top;
    const n = this.n;
    const mask = n - 1;
    const windows = 2 ** (width * block);
    if (!this.checkSample(Math.min(windows / 8, CHECK_SAMPLE))) return false;
    if (this.sliced) return this.sliced.check(p, g, trail, G_SET);
    const first = coneShift[0];
    for (let high = 0; high < windows; high += n) {
      let prefix = 0;
      for (let shift = (width - 1) * block; shift >= block; shift -= block) prefix = (prefix << 1) | p[(high >>> shift) & mask];
      prefix <<= 1;
      for (let x = 0; x < n; x++) {
        const w = high | x;
        let pattern = (w >>> first) & coneMask;
        let cell = top[pattern];
        let d = cell >= 0 ? cell : cone.fill(pattern);
        for (let j = 1; j < block; j++) {
          pattern = (w >>> coneShift[j]) & coneMask;
          cell = top[pattern];
          d = (d << 1) | (cell >= 0 ? cell : cone.fill(pattern));
        }
        const value = p[d];
        const c = prefix | p[x];
        const gc = g[c];
        if (gc !== value) {
          if (gc >= 0) return false;
          g[c] = value;
          trail.push(G_SET, c);
        }
      }
    }
    return true;
  }

  /**
   * The first `count` windows of an odd-stride permutation of all of them: conflicts of a near miss tend to sit
   * together in counting order (they share blocks), so a spread sample meets one sooner.
   */
  checkSample(count: number): boolean {
    const { p, g, block, width, trail } = this;
    const mask = this.n - 1;
    const last = 2 ** (width * block) - 1;
    for (let i = 0; i < count; i++) {
      const w = Math.imul(i, SAMPLE_STRIDE) & last;
      let c = 0;
      for (let shift = (width - 1) * block; shift >= 0; shift -= block) c = (c << 1) | p[(w >>> shift) & mask];
      const value = p[this.image(w)];
      const gc = g[c];
      if (gc !== value) {
        if (gc >= 0) return false;
        g[c] = value;
        trail.push(G_SET, c);
      }
    }
    return true;
  }

  /**
   * Unit propagation. The all-zero projection satisfies every window, so without the clause "some state projects
   * to 1" a branch of zeros would run through the whole table before being thrown away; with it, the branch
   * ends when the last state is forced.
   */
  propagate(): boolean {
    while (this.queue.length > 0) {
      if (this.assigned[1] === 0 && this.assigned[0] >= this.n - 1) {
        if (this.assigned[0] === this.n) return false;
        if (this.p.indexOf(-1) >= 0) this.assign(this.p.indexOf(-1), 1);
      }
      if (this.assigned[0] + this.assigned[1] === this.n) return this.checkAll();
      if (!this.process(this.queue.pop() as number)) return false;
    }
    return true;
  }

  undo(mark: number): void {
    const { trail } = this;
    while (trail.length > mark) {
      const value = trail.pop() as number;
      const kind = trail.pop() as number;
      if (kind === P_SET) {
        this.assigned[this.p[value]]--;
        this.p[value] = -1;
      }
      else if (kind === G_SET) this.g[value] = -1;
      else if (kind === PROCESSED) this.processedCount--;
      else {
        const c = Math.floor(value / this.n);
        const d = value % this.n;
        this.waitG[c].pop();
        this.waitP[d].pop();
        this.waitMask[c] &= ~(1 << d);
      }
    }
  }

  /** An unassigned state, preferring one that bits of g wait for; −1 when every state is assigned. */
  branchState(): number {
    let free = -1;
    for (let s = 0; s < this.n; s++) {
      if (this.p[s] >= 0) continue;
      if (this.waitP[s].length > 0) return s;
      if (free < 0) free = s;
    }
    return free;
  }

  visit(): void {
    if (this.shouldStop()) throw new StopOnDemand();
    const v = this.branchState();
    if (v < 0) {
      this.record();
      return;
    }
    for (const value of [0, 1]) {
      const mark = this.trail.length;
      this.queue.length = 0;
      this.assign(v, value);
      if (this.propagate()) this.visit();
      this.undo(mark);
    }
  }

  private record(): void {
    const key = this.g.join("");
    const entry = this.found.get(key);
    if (entry) entry.count++;
    else this.found.set(key, { table: Uint8Array.from(this.g), count: 1n, example: Uint8Array.from(this.p) });
  }
}

/**
 * All binary projections with p(0) = 0 of the block-N, T-step supercell of binary rule `t`, using both symbols,
 * keyed by the coarse table's bits; null when stopped. Call only where onDemandApplies.
 */
export function solveZeroRootedOnDemand(t: RuleTable, block: number, steps: number, hooks: { shouldStop?: () => boolean } = {}): Map<string, WideProjectionClass> | null {
  if (!onDemandApplies(t, block, steps)) throw new RangeError(`the on-demand projection search does not handle k=${t.k}, r=${t.r}, N=${block}, T=${steps}`);
  const search = new OnDemandSearch(t, block, steps, hooks.shouldStop ?? (() => false));
  search.assign(0, 0);
  if (!search.propagate()) return search.found;
  try {
    search.visit();
  } catch (e) {
    if (e instanceof StopOnDemand) return null;
    throw e;
  }
  return search.found;
}
