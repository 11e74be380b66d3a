import { CaInputError, type RuleTable } from "./ruleTable";
import { spaceTime, spaceTimeRow, type SpaceTime } from "./spaceTime";

/**
 * Projects a row block by block: block i is cells iN … iN+N−1, read as a base-k number with the
 * leftmost cell most significant (DOMAIN.md §1), and becomes the coarse symbol proj[state].
 */
export function projectRow(row: ArrayLike<number>, k: number, N: number, proj: ArrayLike<number>): Uint8Array {
  if (row.length % N !== 0) throw new CaInputError("width", `a row of ${row.length} cells does not split into blocks of ${N}`);
  if (proj.length !== k ** N) throw new CaInputError("projection", `expected ${k ** N} entries (one per block state), got ${proj.length}`);
  const out = new Uint8Array(row.length / N);
  for (let b = 0; b < out.length; b++) {
    let state = 0;
    for (let j = 0; j < N; j++) state = state * k + row[b * N + j];
    out[b] = proj[state];
  }
  return out;
}

/** The three panels that show a projection square commuting on one periodic row. */
export type CommutingPicture = {
  /** The fine evolution, every row kept (T·steps + 1 rows). */
  fine: SpaceTime;
  /** The fine evolution sampled every T steps and projected block by block. */
  projected: SpaceTime;
  /** The coarse CA run from the projected initial row. */
  coarse: SpaceTime;
  /** 1 where `projected` and `coarse` differ; all zero when the square commutes on this row. */
  difference: SpaceTime;
  differing: number;
};

export type CommutingPictureInput = {
  fine: RuleTable;
  coarse: RuleTable;
  block: number;
  /** Fine steps per coarse step. */
  steps: number;
  projection: ArrayLike<number>;
  /** The fine initial row; its width must be a multiple of the block size. */
  initial: ArrayLike<number>;
  /** Coarse steps to draw. */
  coarseSteps: number;
};

/**
 * The picture that shows why a coarse-graining holds: π(f^{T·s}(x)) beside g^s(π(x)) and their
 * difference, on a periodic row. On a periodic row of w blocks the fine evolution is that of the
 * w-periodic configuration, so a certified square (checked on every window) makes the difference empty.
 */
export function commutingPicture(input: CommutingPictureInput): CommutingPicture {
  const { fine: f, coarse: g, block: N, steps: T, projection, initial, coarseSteps } = input;
  const fine = spaceTime(f, initial, coarseSteps * T);
  const width = initial.length / N;
  const projected: SpaceTime = { k: g.k, width, rows: coarseSteps + 1, cells: new Uint8Array(width * (coarseSteps + 1)) };
  for (let s = 0; s <= coarseSteps; s++) projected.cells.set(projectRow(spaceTimeRow(fine, s * T), f.k, N, projection), s * width);
  const coarse = spaceTime(g, spaceTimeRow(projected, 0), coarseSteps);
  const difference: SpaceTime = { k: 2, width, rows: coarseSteps + 1, cells: new Uint8Array(projected.cells.length) };
  let differing = 0;
  for (let i = 0; i < difference.cells.length; i++) {
    if (projected.cells[i] !== coarse.cells[i]) {
      difference.cells[i] = 1;
      differing++;
    }
  }
  return { fine, projected, coarse, difference, differing };
}
