/**
 * Binary projections of a CA of any radius R on n states (a supercell with T ≠ N, or of a wider source): every
 * p: {0..n-1} → {0,1} with p(0) = 0, using both symbols, such that p(F(X_{-R} … X_R)) = g(p(X_{-R}), …, p(X_R))
 * for every window, grouped by g (a table of 2^(2R+1) bits, index as in DOMAIN.md §1).
 *
 * Depth-first over p with joint unit propagation on p and g and an undo trail: a window whose inputs are all
 * assigned fixes a bit of g from its image or its image from g; a window with one unassigned input state is
 * narrowed to the values that agree with the bits of g already known. The radius-1 case keeps the model-counting
 * solver of projectionSolver.ts; this one lists solutions, so it is meant for n ≤ MAX_WIDE_STATES.
 */
import type { Supercell } from "./supercell";

export const MAX_WIDE_STATES = 16;

export interface WideProjectionClass {
  /** coarse rule table g, 2^(2R+1) bits */
  table: Uint8Array;
  count: bigint;
  /** one projection with this target, block state → 0/1 */
  example: Uint8Array;
}

/** Counts a complete projection p under its coarse table g (a copy of both is kept for the first of each g). */
export function recordSolution(found: Map<string, WideProjectionClass>, g: Int8Array, p: Int8Array): void {
  const key = g.join("");
  const entry = found.get(key);
  if (entry) entry.count++;
  else found.set(key, { table: Uint8Array.from(g), count: 1n, example: Uint8Array.from(p) });
}

interface WideProblem {
  n: number;
  width: number;
  windows: number;
  /** window w's inputs at inputs[w·width + i], its image at image[w] */
  inputs: Int32Array;
  image: Int32Array;
  /** windows in which a state occurs (as an input or image), each once: CSR */
  occStart: Int32Array;
  occ: Int32Array;
}

function buildWideProblem(cell: Supercell): WideProblem {
  const { n, out } = cell;
  const width = 2 * cell.radius + 1;
  const windows = out.length;
  const inputs = new Int32Array(windows * width);
  const image = Int32Array.from(out);
  const lists: number[][] = Array.from({ length: n }, () => []);
  const seen = new Int32Array(n).fill(-1);
  const bits = Math.log2(n);
  const power = Number.isInteger(bits);
  for (let w = 0; w < windows; w++) {
    if (power) for (let i = width - 1, rest = w; i >= 0; i--, rest >>>= bits) inputs[w * width + i] = rest & (n - 1);
    else for (let i = width - 1, rest = w; i >= 0; i--, rest = Math.floor(rest / n)) inputs[w * width + i] = rest % n;
    for (let i = 0; i <= width; i++) {
      const s = i < width ? inputs[w * width + i] : image[w];
      if (seen[s] !== w) {
        seen[s] = w;
        lists[s].push(w);
      }
    }
  }
  const occStart = new Int32Array(n + 1);
  for (let s = 0; s < n; s++) occStart[s + 1] = occStart[s] + lists[s].length;
  const occ = new Int32Array(occStart[n]);
  for (let s = 0; s < n; s++) occ.set(lists[s], occStart[s]);
  return { n, width, windows, inputs, image, occStart, occ };
}

/** Trail entry kinds, for undoing a branch. */
const P_SET = 0;
const G_SET = 1;
const PENDING = 2;

class WideSearch {
  readonly p: Int8Array;
  readonly g: Int8Array;
  /** per unknown bit of g: windows with every input assigned (giving that bit) whose image is not */
  readonly pending: number[][];
  readonly trail: number[] = [];
  readonly queue: number[] = [];
  readonly found = new Map<string, WideProjectionClass>();

  constructor(
    readonly pb: WideProblem,
    readonly shouldStop: () => boolean,
  ) {
    this.p = new Int8Array(pb.n).fill(-1);
    this.g = new Int8Array(2 ** pb.width).fill(-1);
    this.pending = Array.from({ length: this.g.length }, () => []);
  }

  assign(v: number, value: number): void {
    this.p[v] = value;
    this.trail.push(P_SET, v);
    this.queue.push(v);
  }

  /** Sets bit `idx` of g and forces the images of its pending windows; false on a conflict. */
  setG(idx: number, value: number): boolean {
    this.g[idx] = value;
    this.trail.push(G_SET, idx);
    for (const w of this.pending[idx]) {
      const d = this.pb.image[w];
      if (this.p[d] < 0) this.assign(d, value);
      else if (this.p[d] !== value) return false;
    }
    return true;
  }

  undo(mark: number): void {
    const { trail } = this;
    while (trail.length > mark) {
      const value = trail.pop() as number;
      const kind = trail.pop() as number;
      if (kind === P_SET) this.p[value] = -1;
      else if (kind === G_SET) this.g[value] = -1;
      else this.pending[value].pop();
    }
  }

  /** Index of g for window w, or −1 with `unknownInput` set when exactly one distinct input is unassigned (−2: more). */
  unknownInput = -1;
  index(w: number): number {
    const { inputs, width } = this.pb;
    let idx = 0;
    this.unknownInput = -1;
    for (let i = 0; i < width; i++) {
      const s = inputs[w * width + i];
      const v = this.p[s];
      if (v < 0) {
        if (this.unknownInput === -1 || this.unknownInput === s) this.unknownInput = s;
        else this.unknownInput = -2;
        idx = -1;
      } else if (idx >= 0) idx = (idx << 1) | v;
    }
    return idx;
  }

  /** Values of the single unassigned input u of window w that agree with g and the image (bit 0: value 0 allowed). */
  allowedValues(w: number, u: number): number {
    let allowed = 0;
    for (let value = 0; value < 2; value++) {
      this.p[u] = value;
      const idx = this.index(w);
      const d = this.p[this.pb.image[w]];
      if (this.g[idx] < 0 || d < 0 || this.g[idx] === d) allowed |= 1 << value;
    }
    this.p[u] = -1;
    return allowed;
  }

  propagate(): boolean {
    const { occStart, occ, image } = this.pb;
    while (this.queue.length > 0) {
      const v = this.queue.pop() as number;
      for (let k = occStart[v]; k < occStart[v + 1]; k++) {
        const w = occ[k];
        const idx = this.index(w);
        if (idx < 0) {
          const u = this.unknownInput;
          if (u < 0) continue;
          const allowed = this.allowedValues(w, u);
          if (allowed === 0) return false;
          if (allowed !== 3) this.assign(u, allowed === 1 ? 0 : 1);
          continue;
        }
        const d = image[w];
        const gv = this.g[idx];
        if (gv >= 0) {
          if (this.p[d] < 0) this.assign(d, gv);
          else if (this.p[d] !== gv) return false;
        } else if (this.p[d] >= 0) {
          if (!this.setG(idx, this.p[d])) return false;
        } else {
          this.pending[idx].push(w);
          this.trail.push(PENDING, idx);
        }
      }
    }
    return true;
  }

  /** Branches on the first unassigned state; records every complete assignment that uses both symbols. */
  visit(): void {
    if (this.shouldStop()) throw new StopWide();
    const v = this.p.indexOf(-1);
    if (v < 0) {
      if (this.p.includes(1)) this.record();
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

class StopWide extends Error {}

/** All binary projections with p(0) = 0 of `cell`, using both symbols, keyed by the coarse table's bits; null when stopped. */
export function solveZeroRootedWide(cell: Supercell, hooks: { shouldStop?: () => boolean } = {}): Map<string, WideProjectionClass> | null {
  if (cell.n > MAX_WIDE_STATES) throw new RangeError(`the radius-${cell.radius} projection search lists solutions and takes at most ${MAX_WIDE_STATES} block states, got ${cell.n}`);
  const search = new WideSearch(buildWideProblem(cell), hooks.shouldStop ?? (() => false));
  search.assign(0, 0);
  if (!search.propagate()) return search.found;
  try {
    search.visit();
  } catch (e) {
    if (e instanceof StopWide) return null;
    throw e;
  }
  return search.found;
}
