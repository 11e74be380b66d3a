/**
 * Congruences of the supercell CA: equivalence relations θ on block states with
 * a θ a', b θ b', c θ c' ⇒ F(a,b,c) θ F(a',b',c'). A proper congruence is exactly a coarse-graining onto a CA
 * over its classes (DOMAIN.md §2, projection row), and every congruence contains the principal congruence Cg(x, y)
 * of each of its pairs, so a proper congruence exists iff some Cg(x, y) is proper.
 *
 * Cg is computed by congruence closure with union–find: each pair that causes a union is pushed through every
 * unary translation t(z) = F(z, b, c), F(a, z, c), F(a, b, z); pairs joined through a chain of unions need not be
 * pushed themselves, because translations preserve such chains.
 */
import type { Supercell } from "./supercell";

export interface Closure {
  /** union–find parents: class representatives satisfy parent[x] = x */
  parent: Int32Array;
  classes: number;
}

/** Union–find with path halving; returns the representative of x. */
export function findRoot(parent: Int32Array, x: number): number {
  while (parent[x] !== x) {
    parent[x] = parent[parent[x]];
    x = parent[x];
  }
  return x;
}

export interface ClosureOptions {
  /** pairs already known to generate the total congruence (n × n flags); meeting one ends the closure early */
  knownTotal?: Uint8Array;
  /** stop (returning null) once the work counter passes this many translations */
  workLimit?: number;
  work?: { value: number };
}

/**
 * Smallest congruence containing `start` (a union–find, copied) and the pairs `seeds`.
 * Returns null when it is the total relation (one class) or the work limit was reached (then `work.value` ≥ limit).
 */
export function congruenceClosure(
  cell: Supercell,
  start: Closure | null,
  seeds: ReadonlyArray<readonly [number, number]>,
  options: ClosureOptions = {},
): Closure | null {
  const { n, out } = cell;
  const parent = start ? start.parent.slice() : Int32Array.from({ length: n }, (_, i) => i);
  let classes = start ? start.classes : n;
  const stack: number[] = [];
  const known = options.knownTotal;
  const work = options.work ?? { value: 0 };
  const limit = options.workLimit ?? Infinity;
  let total = false;

  const union = (x: number, y: number): void => {
    if (x === y) return;
    const rx = findRoot(parent, x);
    const ry = findRoot(parent, y);
    if (rx === ry) return;
    if (known && known[x * n + y]) total = true;
    parent[rx] = ry;
    classes--;
    if (classes === 1) total = true;
    stack.push(x, y);
  };

  for (const [x, y] of seeds) union(x, y);
  if (cell.radius !== 1) {
    while (stack.length > 0 && !total) {
      const y = stack.pop() as number;
      const x = stack.pop() as number;
      work.value += out.length * (2 * cell.radius + 1) / n;
      if (work.value > limit) return null;
      translateWide(cell, x, y, union, () => total);
    }
    return total ? null : { parent, classes };
  }
  const n2 = n * n;
  while (stack.length > 0 && !total) {
    const y = stack.pop() as number;
    const x = stack.pop() as number;
    work.value += 3 * n2;
    if (work.value > limit) return null;
    const bx = x * n2;
    const by = y * n2;
    for (let i = 0; i < n2 && !total; i++) union(out[bx + i], out[by + i]);
    for (let a = 0; a < n && !total; a++) {
      const ax = a * n2 + x * n;
      const ay = a * n2 + y * n;
      for (let c = 0; c < n; c++) union(out[ax + c], out[ay + c]);
    }
    for (let ab = 0; ab < n2 && !total; ab++) union(out[ab * n + x], out[ab * n + y]);
  }
  return total ? null : { parent, classes };
}

/**
 * The unary translations of a radius-R table at every window position: for position i with stride n^(2R-i),
 * union F(…, x at i, …) with F(…, y at i, …) over every context of the other positions.
 */
function translateWide(cell: Supercell, x: number, y: number, union: (a: number, b: number) => void, done: () => boolean): void {
  const { n, out } = cell;
  for (let stride = out.length / n; stride >= 1 && !done(); stride /= n) {
    const span = stride * n;
    for (let base = 0; base < out.length && !done(); base += span) {
      const bx = base + x * stride;
      const by = base + y * stride;
      for (let post = 0; post < stride; post++) union(out[bx + post], out[by + post]);
    }
  }
}

/** The classes of a closure as a projection in canonical form (classes numbered by first appearance). */
export function closurePartition(closure: Closure): number[] {
  const n = closure.parent.length;
  const label = new Map<number, number>();
  const proj: number[] = new Array(n);
  for (let s = 0; s < n; s++) {
    const r = findRoot(closure.parent, s);
    let l = label.get(r);
    if (l === undefined) {
      l = label.size;
      label.set(r, l);
    }
    proj[s] = l;
  }
  return proj;
}

/** Coarse rule of a congruence given as a canonical projection onto m classes: table over m^(2R+1) neighbourhoods. */
export function quotientTable(cell: Supercell, proj: readonly number[]): number[] {
  const { n, out } = cell;
  const width = 2 * cell.radius + 1;
  const m = Math.max(...proj) + 1;
  const rep = new Array<number>(m).fill(-1);
  for (let s = 0; s < n; s++) if (rep[proj[s]] < 0) rep[proj[s]] = s;
  const table: number[] = new Array(m ** width);
  for (let idx = 0; idx < table.length; idx++) {
    let w = 0;
    for (let i = width - 1, rest = idx, scale = 1; i >= 0; i--, rest = Math.floor(rest / m), scale *= n) w += rep[rest % m] * scale;
    table[idx] = proj[out[w]];
  }
  return table;
}
