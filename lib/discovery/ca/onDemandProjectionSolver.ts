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
import { LightCone } from "./lightCone";
import { SlicedWindowCheck } from "./slicedWindowCheck";
import { MAX_WIDE_STATES, recordSolution, type WideProjectionClass } from "./wideProjectionSolver";

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
 * Windows checked one by one in spread order before the flat pass, and the odd stride that spreads them: a near
 * miss whose conflicts are rare can survive hundreds of words of 32 windows in counting-like order, yet meet a
 * conflict within this spread sample (one random rule at N = 3: 494 words without the sample, none with it).
 */
const CHECK_SAMPLE = 64;
const SAMPLE_STRIDE = 0x5bd1;

/**
 * A state is processed (its windows evaluated one by one) only while it completes at most this many windows; past
 * that, the remaining states are enumerated and each complete projection meets the flat pass, which refutes a
 * wrong one within a few words of 32 windows. At width 5 (radius-2 coarse rules) the third state completes 211
 * windows and the fourth 781, so three states are processed. Measured on random radius-2 rules at N = 3: with no
 * budget, 31 rules with one hard rule among them took 2.9 ms; with a budget of four states 1.1 ms, of three 0.9 ms,
 * of two 2.0 ms.
 */
const WINDOW_BUDGET = 256;

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
  found = new Map<string, WideProjectionClass>();
  shouldStop: () => boolean = () => false;
  private readonly cone: LightCone;
  private readonly coneShift: Int32Array;
  private readonly coneMask: number;
  /** the flat pass 32 windows at a time, where the sizes line up */
  private readonly sliced: SlicedWindowCheck | null;
  private current = 0;

  constructor(
    r: number,
    readonly block: number,
    readonly steps: number,
  ) {
    const R = Math.ceil((r * steps) / block);
    this.n = 2 ** block;
    this.width = 2 * R + 1;
    this.p = new Int8Array(this.n).fill(-1);
    this.g = new Int8Array(2 ** this.width).fill(-1);
    this.processed = new Int32Array(this.n);
    // plain loops: Array.from over an array-like with a map function is slow for a search that runs in microseconds
    this.waitG = emptyLists(this.g.length);
    this.waitP = emptyLists(this.n);
    this.waitMask = new Int32Array(this.g.length);
    this.cone = new LightCone(r, steps);
    const cells = this.width * block;
    // output cell j of the centre block is window cell RN + j; its cone ends rT cells to its right
    this.coneShift = new Int32Array(block);
    for (let j = 0; j < block; j++) this.coneShift[j] = cells - 1 - (R * block + j + r * steps);
    this.coneMask = 2 ** (2 * r * steps + 1) - 1;
    this.sliced = SlicedWindowCheck.applies(block, this.width, this.coneMask) ? new SlicedWindowCheck(this.cone, block, this.width, this.coneShift, this.coneMask) : null;
  }

  /**
   * Starts over on rule t (of the radius this search was sized for). Nothing is assigned: a search ends by undoing
   * its whole trail (see solveZeroRootedOnDemand), which is cheaper than clearing every buffer.
   */
  reset(t: RuleTable, shouldStop: () => boolean): void {
    this.cone.load(t);
    this.shouldStop = shouldStop;
    this.found = new Map();
    this.queue.length = 0;
  }

  /** The centre block after T steps of window w (blocks as N-bit digits, leftmost most significant). */
  image(w: number): number {
    const { cone, coneShift, coneMask } = this;
    let v = 0;
    for (let j = 0; j < this.block; j++) v = (v << 1) | cone.cell((w >>> coneShift[j]) & coneMask);
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
   * (slicedWindowCheck.ts: 32 windows per word, reading the cone's words).
   */
  checkAll(): boolean {
    const { p, g, block, width, trail } = this;
    const n = this.n;
    const mask = n - 1;
    const windows = 2 ** (width * block);
    if (!this.checkSample(Math.min(windows / 8, CHECK_SAMPLE))) return false;
    if (this.sliced) return this.sliced.check(p, g, trail, G_SET);
    for (let high = 0; high < windows; high += n) {
      let prefix = 0;
      for (let shift = (width - 1) * block; shift >= block; shift -= block) prefix = (prefix << 1) | p[(high >>> shift) & mask];
      prefix <<= 1;
      for (let x = 0; x < n; x++) {
        if (!this.meet(prefix | p[x], p[this.image(high | x)])) return false;
      }
    }
    return true;
  }

  /** A window of a complete assignment: bit c of g must be `value` (set here, on the trail, when unset). */
  private meet(c: number, value: number): boolean {
    const gc = this.g[c];
    if (gc === value) return true;
    if (gc >= 0) return false;
    this.g[c] = value;
    this.trail.push(G_SET, c);
    return true;
  }

  /**
   * The first `count` windows of an odd-stride permutation of all of them: conflicts of a near miss tend to sit
   * together in counting order (they share blocks), so a spread sample meets one sooner.
   */
  checkSample(count: number): boolean {
    const { p, block, width } = this;
    const mask = this.n - 1;
    const last = 2 ** (width * block) - 1;
    for (let i = 0; i < count; i++) {
      const w = Math.imul(i, SAMPLE_STRIDE) & last;
      let c = 0;
      for (let shift = (width - 1) * block; shift >= 0; shift -= block) c = (c << 1) | p[(w >>> shift) & mask];
      if (!this.meet(c, p[this.image(w)])) return false;
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
      const v = this.queue.pop() as number;
      if (this.completes(this.processedCount + 1) <= WINDOW_BUDGET && !this.process(v)) return false;
    }
    return true;
  }

  /** How many windows the k-th processed state completes: those over k states that use it at least once. */
  completes(k: number): number {
    return k ** this.width - (k - 1) ** this.width;
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
    recordSolution(this.found, this.g, this.p);
  }
}

/** Searches whose light cone is at most this many patterns are kept for the next rule of the same sizes. */
const POOLED_CONE_PATTERNS = 2 ** 16;
const pool = new Map<string, OnDemandSearch>();

/**
 * A search sized for (r, N, T): the buffers of a small one are reused, since allocating them costs as much as
 * refuting a rule (an atlas job runs thousands of rules of the same sizes).
 */
function pooledSearch(r: number, block: number, steps: number): OnDemandSearch {
  if (2 * r * steps + 1 > Math.log2(POOLED_CONE_PATTERNS)) return new OnDemandSearch(r, block, steps);
  const key = `${r}/${block}/${steps}`;
  let search = pool.get(key);
  if (!search) pool.set(key, (search = new OnDemandSearch(r, block, steps)));
  return search;
}

/**
 * All binary projections with p(0) = 0 of the block-N, T-step supercell of binary rule `t`, using both symbols,
 * keyed by the coarse table's bits; null when stopped. Call only where onDemandApplies.
 */
export function solveZeroRootedOnDemand(t: RuleTable, block: number, steps: number, hooks: { shouldStop?: () => boolean } = {}): Map<string, WideProjectionClass> | null {
  if (!onDemandApplies(t, block, steps)) throw new RangeError(`the on-demand projection search does not handle k=${t.k}, r=${t.r}, N=${block}, T=${steps}`);
  const search = pooledSearch(t.r, block, steps);
  search.reset(t, hooks.shouldStop ?? (() => false));
  try {
    search.assign(0, 0);
    if (search.propagate()) search.visit();
    return search.found;
  } catch (e) {
    if (e instanceof StopOnDemand) return null;
    throw e;
  } finally {
    // back to nothing assigned, so that the pooled search is ready for the next rule
    search.undo(0);
  }
}
