import { toDigits } from "./evolveCells";
import { CaInputError, assertRuleTable, type RuleTable } from "./ruleTable";
import { supercellTable } from "./supercellTable";

/** One fine window (X_{-R} … X_R as block states), its supercell image F(window), and the coarse values. */
export type WindowWitness = {
  window: number[];
  cells: string[];
  image: number;
  imageCells: string;
  coarseWindow: number[];
  coarse: number;
};

export type ProjectionCounterexample =
  /** proj(F(window)) differs from the claimed coarse rule at proj(window). */
  | ({ kind: "coarse-rule-mismatch"; claimed: number } & WindowWitness)
  /** Two windows with equal coarse inputs and different coarse outputs: no coarse rule exists. */
  | { kind: "not-a-function"; first: WindowWitness; second: WindowWitness };

export type ProjectionCheck =
  | { ok: true; coarse: RuleTable; windows: number }
  | { ok: false; counterexample: ProjectionCounterexample };

export type CheckProjectionOptions = {
  /** Fine steps per coarse step. @default N */
  steps?: number;
  /** A claimed coarse rule to compare with; without it the coarse rule is derived. */
  target?: RuleTable;
  /**
   * The table supercellTable(t, N, steps) returns, for a caller that checks many projections of one rule (it is
   * used as given, so pass only the core's own table); its shape is checked.
   */
  supercell?: RuleTable;
};

/**
 * The commuting-square check of DOMAIN.md §2, exhaustive over every window: proj(F(X)) must equal
 * g(proj X_{-R}, …, proj X_R). Without a claimed g it derives g and fails when two windows with the same
 * coarse input disagree. The loop is deliberately plain; speed comes from supercellTable.
 */
export function checkProjection(t: RuleTable, N: number, proj: ArrayLike<number>, options: CheckProjectionOptions = {}): ProjectionCheck {
  assertRuleTable(t);
  const T = options.steps ?? N;
  const F = options.supercell ?? supercellTable(t, N, T);
  if (options.supercell && (F.k !== t.k ** N || F.r !== Math.ceil((t.r * T) / N) || F.table.length !== F.k ** (2 * F.r + 1)))
    throw new CaInputError("supercell", `the given supercell table does not have the shape of block ${N} with ${T} steps`);
  const K = F.k;
  const m = coarseAlphabet(proj, K);
  const width = 2 * F.r + 1;
  const coarseSize = m ** width;
  const target = options.target;
  if (target && (target.k !== m || target.r !== F.r || target.table.length !== coarseSize))
    throw new CaInputError("target", `claimed coarse rule has k=${target.k}, r=${target.r}; the projection gives k=${m}, r=${F.r}`);
  const g = target ? target.table : new Uint8Array(coarseSize);
  const witness = target ? null : new Float64Array(coarseSize).fill(-1);
  const witnessOf = (w: number) => windowWitness(F, t.k, N, proj, m, w);

  const p = Uint8Array.from(proj);
  const image = F.table;
  const prefixes = K ** (width - 1);
  for (let prefix = 0; prefix < prefixes; prefix++) {
    let coarsePrefix = 0;
    for (const block of toDigits(prefix, K, width - 1)) coarsePrefix = coarsePrefix * m + p[block];
    for (let x = 0; x < K; x++) {
      const w = prefix * K + x;
      const c = coarsePrefix * m + p[x];
      const y = p[image[w]];
      if (witness === null) {
        if (g[c] !== y) return { ok: false, counterexample: { kind: "coarse-rule-mismatch", claimed: g[c], ...witnessOf(w) } };
      } else if (witness[c] < 0) {
        witness[c] = w;
        g[c] = y;
      } else if (g[c] !== y) {
        return { ok: false, counterexample: { kind: "not-a-function", first: witnessOf(witness[c]), second: witnessOf(w) } };
      }
    }
  }
  return { ok: true, coarse: { k: m, r: F.r, table: target ? Uint8Array.from(g) : g }, windows: prefixes * K };
}

/** Number of coarse symbols; every symbol 0..m-1 must be the image of some block state (DOMAIN.md §1). */
export function coarseAlphabet(proj: ArrayLike<number>, K: number): number {
  if (proj.length !== K) throw new CaInputError("projection", `expected ${K} entries (one per block state), got ${proj.length}`);
  let m = 0;
  for (let s = 0; s < K; s++) {
    const v = proj[s];
    if (!Number.isInteger(v) || v < 0 || v > 255) throw new CaInputError("projection", `entry ${s} is ${v}, not a symbol in 0..255`);
    m = Math.max(m, v + 1);
  }
  const used = new Set(Array.from(proj));
  if (used.size !== m) throw new CaInputError("projection", `uses ${used.size} of the symbols 0..${m - 1}; every coarse symbol must be used`);
  return m;
}

function windowWitness(F: RuleTable, k: number, N: number, proj: ArrayLike<number>, m: number, w: number): WindowWitness {
  const window = Array.from(toDigits(w, F.k, 2 * F.r + 1));
  const image = F.table[w];
  const coarseWindow = window.map((s) => proj[s]);
  return {
    window,
    cells: window.map((s) => cellString(s, k, N)),
    image,
    imageCells: cellString(image, k, N),
    coarseWindow,
    coarse: proj[image],
  };
}

/** A block state as its N cells, leftmost first (base-36 digits, so up to 36 symbols read naturally). */
export function cellString(state: number, k: number, N: number): string {
  return Array.from(toDigits(state, k, N), (d) => d.toString(36)).join("");
}
