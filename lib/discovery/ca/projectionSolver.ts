/**
 * Binary projections of a radius-1 CA on n states: every p: {0..n-1} → {0,1} using both symbols such that
 * p(F(a,b,c)) = g(p(a), p(b), p(c)) for every window, grouped by the (then unique) coarse rule g.
 *
 * Instead of enumerating 2^n projections, the search fixes p(0) = 0 (the complement projection 1 − p gives the
 * complement-conjugate target), splits on the first state x with p(x) = 1, reads off the bits of g that the
 * prefix already forces, and for each g still possible counts the solutions of the fixed-g constraint problem by
 * unit propagation, removal of constraints that hold whatever the unassigned values are, and independent
 * components (a small exact model counter, so that rules with astronomically many projections are counted
 * without listing them).
 */
import type { Supercell } from "./supercell";

export interface ProjectionClass {
  /** Coarse rule table, bit 4x + 2y + z = g(x, y, z). */
  target: number;
  count: bigint;
  /** One projection with this target, as block-state → 0/1. */
  example: Uint8Array;
}

interface Problem {
  n: number;
  out: Supercell["out"];
  /** window w decoded: left, centre, right state and image */
  A: Int32Array;
  B: Int32Array;
  C: Int32Array;
  D: Int32Array;
  /** occurrence lists (CSR): windows in which a state appears as left, centre, right or image */
  occStart: Int32Array;
  occ: Int32Array;
  /** scratch marks for collecting windows without repeats */
  stamp: Uint32Array;
  generation: { value: number };
}

function buildProblem(cell: Supercell): Problem {
  const { n, out } = cell;
  const W = n * n * n;
  const A = new Int32Array(W);
  const B = new Int32Array(W);
  const C = new Int32Array(W);
  const D = new Int32Array(W);
  const degree = new Int32Array(n);
  for (let a = 0, w = 0; a < n; a++) {
    for (let b = 0; b < n; b++) {
      for (let c = 0; c < n; c++, w++) {
        const d = out[w];
        A[w] = a;
        B[w] = b;
        C[w] = c;
        D[w] = d;
        degree[a]++;
        if (b !== a) degree[b]++;
        if (c !== a && c !== b) degree[c]++;
        if (d !== a && d !== b && d !== c) degree[d]++;
      }
    }
  }
  const occStart = new Int32Array(n + 1);
  for (let v = 0; v < n; v++) occStart[v + 1] = occStart[v] + degree[v];
  const fill = occStart.slice(0, n);
  const occ = new Int32Array(occStart[n]);
  for (let w = 0; w < W; w++) {
    const a = A[w];
    const b = B[w];
    const c = C[w];
    const d = D[w];
    occ[fill[a]++] = w;
    if (b !== a) occ[fill[b]++] = w;
    if (c !== a && c !== b) occ[fill[c]++] = w;
    if (d !== a && d !== b && d !== c) occ[fill[d]++] = w;
  }
  return { n, out, A, B, C, D, occStart, occ, stamp: new Uint32Array(W), generation: { value: 0 } };
}

/** Up to this many constrained states, the residual problem is counted by trying every assignment. */
const BRUTE_FORCE_STATES = 12;

const CONFLICT = -1;
const TAUTOLOGY = 1;
const OPEN = 0;

/** Thrown inside a count when the search is told to stop; caught by solveZeroRootedProjections. */
class StopSearch extends Error {}

class FixedTarget {
  readonly vars = new Int32Array(4);
  constructor(
    readonly pb: Problem,
    readonly g: number,
    readonly shouldStop: () => boolean = () => false,
  ) {}

  holds(w: number, p: Int8Array): boolean {
    const { A, B, C, D } = this.pb;
    return ((this.g >> ((p[A[w]] << 2) | (p[B[w]] << 1) | p[C[w]])) & 1) === p[D[w]];
  }

  /** Distinct unassigned states of window w, into this.vars; returns how many. */
  unassigned(w: number, p: Int8Array): number {
    const { A, B, C, D } = this.pb;
    const vars = this.vars;
    let k = 0;
    const a = A[w];
    const b = B[w];
    const c = C[w];
    const d = D[w];
    if (p[a] < 0) vars[k++] = a;
    if (p[b] < 0 && b !== a) vars[k++] = b;
    if (p[c] < 0 && c !== a && c !== b) vars[k++] = c;
    if (p[d] < 0 && d !== a && d !== b && d !== c) vars[k++] = d;
    return k;
  }

  /** After classify: bit i set when the window's truth depends on this.vars[i]. */
  essential = 0;

  /** Classify window w under p: CONFLICT, TAUTOLOGY (holds for every completion) or OPEN. */
  classify(w: number, p: Int8Array): number {
    const k = this.unassigned(w, p);
    this.essential = 0;
    if (k === 0) return this.holds(w, p) ? TAUTOLOGY : CONFLICT;
    const vars = this.vars;
    let truth = 0;
    const combos = 1 << k;
    for (let m = 0; m < combos; m++) {
      for (let i = 0; i < k; i++) p[vars[i]] = (m >> i) & 1;
      if (this.holds(w, p)) truth |= 1 << m;
    }
    for (let i = 0; i < k; i++) p[vars[i]] = -1;
    if (truth === 0) return CONFLICT;
    if (truth === (1 << combos) - 1) return TAUTOLOGY;
    for (let i = 0; i < k; i++) {
      for (let m = 0; m < combos; m++) {
        if (((truth >> m) & 1) !== ((truth >> (m ^ (1 << i))) & 1)) {
          this.essential |= 1 << i;
          break;
        }
      }
    }
    return OPEN;
  }

  /** Unit propagation from the states in `queue`; false on a conflict. */
  propagate(p: Int8Array, queue: number[]): boolean {
    const { occStart, occ } = this.pb;
    while (queue.length > 0) {
      const v = queue.pop() as number;
      for (let i = occStart[v]; i < occStart[v + 1]; i++) {
        const w = occ[i];
        const k = this.unassigned(w, p);
        if (k === 0) {
          if (!this.holds(w, p)) return false;
        } else if (k === 1) {
          const u = this.vars[0];
          p[u] = 0;
          const ok0 = this.holds(w, p);
          p[u] = 1;
          const ok1 = this.holds(w, p);
          if (!ok0 && !ok1) {
            p[u] = -1;
            return false;
          }
          if (ok0 && ok1) p[u] = -1;
          else {
            p[u] = ok0 ? 0 : 1;
            queue.push(u);
          }
        }
      }
    }
    return true;
  }

  /**
   * Number of completions, over the unassigned states in `scope`, of p satisfying every window in `windows`
   * (null: all windows); every other window already holds whatever those values are. p is left unchanged;
   * `example` receives p completed on `scope` when the count is positive.
   */
  count(p: Int8Array, windows: Int32Array | null, scope: Int32Array, example: { p: Int8Array | null }): bigint {
    if (this.shouldStop()) throw new StopSearch();
    const { n } = this.pb;
    const open: number[] = [];
    const candidates = windows ?? this.windowsOfUnassigned(p, scope);
    if (candidates.length === 0) {
      example.p = p.slice();
      for (const v of scope) if (example.p[v] < 0) example.p[v] = 0;
      let free = 0;
      for (const v of scope) if (p[v] < 0) free++;
      return 1n << BigInt(free);
    }
    // per open window, its essential states (a window's truth may ignore some of its unassigned states)
    const openVars: number[][] = [];
    for (let i = 0; i < candidates.length; i++) {
      const w = candidates[i];
      const state = this.classify(w, p);
      if (state === CONFLICT) return 0n;
      if (state === OPEN) {
        open.push(w);
        const ess: number[] = [];
        for (let j = 0; j < 4; j++) if ((this.essential >> j) & 1) ess.push(this.vars[j]);
        openVars.push(ess);
      }
    }
    // union–find over unassigned states linked by open windows
    const parent = new Int32Array(n).map((_, i) => i);
    const find = (x: number): number => {
      while (parent[x] !== x) x = parent[x] = parent[parent[x]];
      return x;
    };
    const touched = new Uint8Array(n);
    for (const ess of openVars) {
      for (const v of ess) {
        touched[v] = 1;
        parent[find(v)] = find(ess[0]);
      }
    }
    const solution = p.slice();
    let free = 0;
    const members = new Map<number, number[]>();
    for (const v of scope) {
      if (p[v] >= 0) continue;
      if (!touched[v]) {
        free++;
        solution[v] = 0;
        continue;
      }
      const root = find(v);
      const list = members.get(root);
      if (list) list.push(v);
      else members.set(root, [v]);
    }
    let constrained = 0;
    for (const list of members.values()) constrained += list.length;
    if (constrained <= BRUTE_FORCE_STATES) {
      const c = this.bruteForce(solution, [...members.values()].flat(), open);
      if (c === 0n) return 0n;
      example.p = solution;
      return c << BigInt(free);
    }
    const groups = new Map<number, number[]>();
    for (let i = 0; i < open.length; i++) {
      const w = open[i];
      const root = find(openVars[i][0]);
      const list = groups.get(root);
      if (list) list.push(w);
      else groups.set(root, [w]);
    }
    let result = 1n << BigInt(free);
    for (const [root, list] of groups) {
      const comp = Int32Array.from(list);
      const compScope = Int32Array.from(members.get(root) ?? []);
      const branchVar = this.mostFrequent(comp, p);
      let sum = 0n;
      let firstChild: Int8Array | null = null;
      for (const value of [0, 1]) {
        const child = p.slice();
        child[branchVar] = value;
        if (!this.propagate(child, [branchVar])) continue;
        const sub = { p: null as Int8Array | null };
        const c = this.count(child, comp, compScope, sub);
        if (c > 0n) {
          sum += c;
          if (!firstChild) firstChild = sub.p;
        }
      }
      if (sum === 0n) return 0n;
      result *= sum;
      if (firstChild) for (const v of compScope) solution[v] = firstChild[v];
    }
    example.p = solution;
    return result;
  }

  /**
   * Number of assignments of `vars` under which every window of `open` holds, by trying them all; `solution`
   * (with every other state assigned) receives the first. Windows that fail move to the front, so most
   * assignments are refuted by the first window tried.
   */
  private bruteForce(solution: Int8Array, vars: number[], open: number[]): bigint {
    const order = open.slice();
    let count = 0;
    let first = -1;
    const p = solution;
    // states of other components may sit in these windows without affecting them: give them any value
    for (const w of open) {
      const k = this.unassigned(w, p);
      for (let i = 0; i < k; i++) if (!vars.includes(this.vars[i])) p[this.vars[i]] = 0;
    }
    for (let mask = 0; mask < 1 << vars.length; mask++) {
      if ((mask & 1023) === 1023 && this.shouldStop()) throw new StopSearch();
      for (let i = 0; i < vars.length; i++) p[vars[i]] = (mask >> i) & 1;
      let ok = true;
      for (let k = 0; k < order.length; k++) {
        if (this.holds(order[k], p)) continue;
        if (k > 0) {
          const w = order[k];
          order[k] = order[0];
          order[0] = w;
        }
        ok = false;
        break;
      }
      if (ok) {
        count++;
        if (first < 0) first = mask;
      }
    }
    for (let i = 0; i < vars.length; i++) p[vars[i]] = first < 0 ? -1 : (first >> i) & 1;
    return BigInt(count);
  }

  /** Windows that contain an unassigned state of `scope`, each once. */
  private windowsOfUnassigned(p: Int8Array, scope: Int32Array): Int32Array {
    const { occStart, occ, stamp, generation } = this.pb;
    const mark = ++generation.value;
    const list: number[] = [];
    for (const v of scope) {
      if (p[v] >= 0) continue;
      for (let i = occStart[v]; i < occStart[v + 1]; i++) {
        const w = occ[i];
        if (stamp[w] !== mark) {
          stamp[w] = mark;
          list.push(w);
        }
      }
    }
    return Int32Array.from(list);
  }

  private mostFrequent(windows: Int32Array, p: Int8Array): number {
    const tally = new Map<number, number>();
    let best = -1;
    let bestCount = 0;
    for (const w of windows) {
      this.classify(w, p);
      for (let i = 0; i < 4; i++) {
        if (!((this.essential >> i) & 1)) continue;
        const v = this.vars[i];
        const t = (tally.get(v) ?? 0) + 1;
        tally.set(v, t);
        if (t > bestCount) {
          bestCount = t;
          best = v;
        }
      }
    }
    return best;
  }
}

export interface SolverHooks {
  /** polled between search nodes; return true to stop */
  shouldStop?: () => boolean;
}

interface State {
  p: Int8Array;
  /** bits of the coarse rule, −1 while unknown */
  g: Int8Array;
  /** per unknown bit of g: windows whose three inputs are known with that index but whose image is not */
  pending: number[][];
  hasOne: boolean;
}

function copyState(s: State): State {
  return { p: s.p.slice(), g: s.g.slice(), pending: s.pending.map((l) => l.slice()), hasOne: s.hasOne };
}

/**
 * Unit propagation while g is still partly unknown: each window links g(index of its inputs) with p(image).
 * Returns false on a conflict.
 */
function propagateJoint(pb: Problem, s: State, queueP: number[], queueG: number[]): boolean {
  const { A, B, C, D, occStart, occ } = pb;
  const { p, g, pending } = s;
  while (queueP.length > 0 || queueG.length > 0) {
    if (queueG.length > 0) {
      const bit = queueG.pop() as number;
      const value = g[bit];
      for (const w of pending[bit]) {
        const d = D[w];
        if (p[d] < 0) {
          p[d] = value;
          if (value === 1) s.hasOne = true;
          queueP.push(d);
        } else if (p[d] !== value) return false;
      }
      pending[bit] = [];
      continue;
    }
    const v = queueP.pop() as number;
    for (let i = occStart[v]; i < occStart[v + 1]; i++) {
      const w = occ[i];
      const a = A[w];
      const b = B[w];
      const c = C[w];
      const d = D[w];
      const pa = p[a];
      const pb2 = p[b];
      const pc = p[c];
      if (pa >= 0 && pb2 >= 0 && pc >= 0) {
        const idx = (pa << 2) | (pb2 << 1) | pc;
        const gv = g[idx];
        const pd = p[d];
        if (gv < 0) {
          if (pd >= 0) {
            g[idx] = pd;
            queueG.push(idx);
          } else pending[idx].push(w);
        } else if (pd < 0) {
          p[d] = gv;
          if (gv === 1) s.hasOne = true;
          queueP.push(d);
        } else if (pd !== gv) return false;
        continue;
      }
      // one unknown input state (possibly also the image): force it when one value contradicts known bits of g
      const u = pa < 0 ? a : pb2 < 0 ? b : c;
      if ((p[a] < 0 && a !== u) || (p[b] < 0 && b !== u) || (p[c] < 0 && c !== u) || (p[d] < 0 && d !== u)) continue;
      let allowed = 0;
      for (let val = 0; val < 2; val++) {
        p[u] = val;
        const gv = g[(p[a] << 2) | (p[b] << 1) | p[c]];
        if (gv < 0 || gv === p[d]) allowed |= 1 << val;
      }
      p[u] = -1;
      if (allowed === 0) return false;
      if (allowed !== 3) {
        p[u] = allowed === 1 ? 0 : 1;
        if (p[u] === 1) s.hasOne = true;
        queueP.push(u);
      }
    }
  }
  return true;
}

/**
 * All binary projections with p(0) = 0 of the radius-1 CA `cell`, using both symbols, grouped by target.
 * Returns null when stopped by the hook.
 */
export function solveZeroRootedProjections(cell: Supercell, hooks: SolverHooks = {}): Map<number, ProjectionClass> | null {
  const pb = buildProblem(cell);
  const { n } = pb;
  const found = new Map<number, ProjectionClass>();
  let stopped = false;
  const root: State = { p: new Int8Array(n).fill(-1), g: new Int8Array(8).fill(-1), pending: Array.from({ length: 8 }, () => []), hasOne: false };
  root.p[0] = 0;
  if (!propagateJoint(pb, root, [0], [])) return found;

  const visit = (s: State): void => {
    if (stopped) return;
    if (hooks.shouldStop?.()) {
      stopped = true;
      return;
    }
    let unknownBit = -1;
    for (let i = 0; i < 8; i++) if (s.g[i] < 0 && (unknownBit < 0 || s.pending[i].length > s.pending[unknownBit].length)) unknownBit = i;
    if (unknownBit < 0) {
      let gNum = 0;
      for (let i = 0; i < 8; i++) gNum |= s.g[i] << i;
      const solver = new FixedTarget(pb, gNum, () => hooks.shouldStop?.() ?? false);
      const scope = Int32Array.from({ length: n }, (_, i) => i);
      const example = { p: null as Int8Array | null };
      const c = solver.count(s.p, null, scope, example);
      if (c === 0n) return;
      const entry = found.get(gNum);
      if (entry) entry.count += c;
      else found.set(gNum, { target: gNum, count: c, example: Uint8Array.from(example.p as Int8Array) });
      return;
    }
    if (s.hasOne) {
      for (const value of [0, 1]) {
        const child = copyState(s);
        child.g[unknownBit] = value;
        if (propagateJoint(pb, child, [], [unknownBit])) visit(child);
      }
      return;
    }
    const v = s.p.indexOf(-1);
    if (v < 0) return; // the constant projection: not onto {0, 1}
    for (const value of [0, 1]) {
      const child = copyState(s);
      child.p[v] = value;
      if (value === 1) child.hasOne = true;
      if (propagateJoint(pb, child, [v], [])) visit(child);
    }
  };
  try {
    visit(root);
  } catch (e) {
    if (e instanceof StopSearch) return null;
    throw e;
  }
  return stopped ? null : found;
}
