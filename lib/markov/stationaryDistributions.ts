import { ONE, ZERO, add, div, isZero, mul, sub, type Rational } from "@/lib/rational";
import type { Matrix } from "./matrix";

/** A closed communicating class of a chain and its unique stationary distribution over all n states (zero outside the class). */
export type StationaryClass = { states: number[]; distribution: Rational[] };

export type StationaryResult = {
  /** One entry per closed class, in order of each class's smallest state. */
  closed: StationaryClass[];
  /** States in no closed class: the chain leaves them for good with probability 1. */
  transient: number[];
};

/**
 * The communicating classes of the chain's transition graph (an edge i → j where P[i][j] > 0),
 * by Tarjan's strongly connected components algorithm (Tarjan, SIAM J. Comput. 1, 146, 1972).
 */
export function communicatingClasses(P: Matrix): number[][] {
  const n = P.length;
  const index = new Array<number>(n).fill(-1);
  const low = new Array<number>(n).fill(0);
  const onStack = new Array<boolean>(n).fill(false);
  const stack: number[] = [];
  const classes: number[][] = [];
  let counter = 0;
  const visit = (v: number) => {
    index[v] = low[v] = counter++;
    stack.push(v);
    onStack[v] = true;
    for (let w = 0; w < n; w++) {
      if (isZero(P[v][w])) continue;
      if (index[w] < 0) {
        visit(w);
        low[v] = Math.min(low[v], low[w]);
      } else if (onStack[w]) low[v] = Math.min(low[v], index[w]);
    }
    if (low[v] === index[v]) {
      const members: number[] = [];
      let w: number;
      do {
        w = stack.pop()!;
        onStack[w] = false;
        members.push(w);
      } while (w !== v);
      classes.push(members.sort((a, b) => a - b));
    }
  };
  for (let v = 0; v < n; v++) if (index[v] < 0) visit(v);
  return classes.sort((a, b) => a[0] - b[0]);
}

/**
 * Solves π (P_CC − I) = 0 with Σ π = 1 on one closed class C, exactly, by Gauss–Jordan elimination
 * over the rationals. P restricted to a closed class is stochastic and irreducible, so the solution
 * is unique (Perron–Frobenius; e.g. Kemeny & Snell 1960, §5.1).
 */
function classDistribution(P: Matrix, states: number[]): Rational[] {
  const m = states.length;
  // Unknowns π_1 … π_m; equation j (column j of P_CC − I): Σ_i π_i (P[i][j] − δ_ij) = 0. One is redundant: replace the last by Σ π_i = 1.
  const rows: Rational[][] = [];
  for (let j = 0; j < m - 1; j++) {
    rows.push([...states.map((si, i) => (i === j ? sub(P[si][states[j]], ONE) : P[si][states[j]])), ZERO]);
  }
  rows.push([...states.map(() => ONE), ONE]);
  for (let col = 0; col < m; col++) {
    const pivot = rows.findIndex((r, k) => k >= col && !isZero(r[col]));
    if (pivot < 0) throw new Error("stationary distribution: singular system on a closed class (the matrix is not stochastic)");
    [rows[col], rows[pivot]] = [rows[pivot], rows[col]];
    const p = rows[col][col];
    rows[col] = rows[col].map((x) => div(x, p));
    for (let k = 0; k < m; k++) {
      if (k === col || isZero(rows[k][col])) continue;
      const f = rows[k][col];
      rows[k] = rows[k].map((x, c) => sub(x, mul(f, rows[col][c])));
    }
  }
  return rows.map((r) => r[m]);
}

/**
 * Every stationary distribution of a finite chain is a mixture of the ones returned here: one per
 * closed communicating class, computed exactly (Kemeny & Snell, Finite Markov Chains, 1960, ch. 5).
 */
export function stationaryDistributions(P: Matrix): StationaryResult {
  const n = P.length;
  const classes = communicatingClasses(P);
  const inClass = new Array<number>(n);
  classes.forEach((c, k) => c.forEach((s) => (inClass[s] = k)));
  const isClosed = (c: number[]) => c.every((i) => P[i].every((x, j) => isZero(x) || inClass[j] === inClass[i]));
  const closed: StationaryClass[] = [];
  const transient: number[] = [];
  for (const c of classes) {
    if (!isClosed(c)) {
      transient.push(...c);
      continue;
    }
    const local = classDistribution(P, c);
    const distribution = new Array<Rational>(n).fill(ZERO);
    c.forEach((s, i) => (distribution[s] = local[i]));
    closed.push({ states: c, distribution });
  }
  return { closed, transient: transient.sort((a, b) => a - b) };
}

/** Σ_i π_i P[i][j] for every j: used by callers and tests to confirm π P = π. */
export function applyRow(pi: Rational[], P: Matrix): Rational[] {
  return P[0].map((_, j) => pi.reduce((acc, x, i) => (isZero(x) ? acc : add(acc, mul(x, P[i][j]))), ZERO));
}
