import { CaInputError, type RuleTable } from "./ruleTable";

/**
 * A space-time diagram: `rows` rows of `width` cells, row 0 the initial row and row t the row after
 * t steps, stored row by row (time runs downward).
 */
export type SpaceTime = { k: number; width: number; rows: number; cells: Uint8Array };

/** Largest diagram the core will compute (cells); a page asks for far fewer. */
export const MAX_SPACE_TIME_CELLS = 4_000_000;

/**
 * Runs the rule `steps` times on a periodic row (cell i's left neighbour of cell 0 is cell width − 1),
 * keeping every row. Neighbourhood (x_{-r} … x_r) is read as a base-k number, x_{-r} most
 * significant (DOMAIN.md §1).
 */
export function spaceTime(t: RuleTable, initial: ArrayLike<number>, steps: number): SpaceTime {
  const width = initial.length;
  if (width < 1) throw new CaInputError("width", "the initial row needs at least one cell");
  if (!Number.isInteger(steps) || steps < 0) throw new CaInputError("steps", `the number of steps must be a whole number ≥ 0, got ${steps}`);
  const rows = steps + 1;
  if (width * rows > MAX_SPACE_TIME_CELLS) throw new CaInputError("steps", `${width} × ${rows} cells is more than ${MAX_SPACE_TIME_CELLS}`);
  const cells = new Uint8Array(width * rows);
  for (let i = 0; i < width; i++) {
    const v = initial[i];
    if (!Number.isInteger(v) || v < 0 || v >= t.k) throw new CaInputError("initial", `cell ${i} is ${v}, outside the alphabet 0..${t.k - 1}`);
    cells[i] = v;
  }
  const span = 2 * t.r + 1;
  const top = t.k ** (span - 1);
  for (let s = 1; s < rows; s++) {
    const prev = (s - 1) * width;
    const here = s * width;
    // Sliding window: the index of cell i's neighbourhood, updated by one digit per cell.
    let index = 0;
    for (let j = -t.r; j <= t.r; j++) index = index * t.k + cells[prev + mod(j, width)];
    for (let i = 0; i < width; i++) {
      cells[here + i] = t.table[index];
      const leaving = cells[prev + mod(i - t.r, width)];
      const entering = cells[prev + mod(i + t.r + 1, width)];
      index = (index - leaving * top) * t.k + entering;
    }
  }
  return { k: t.k, width, rows, cells };
}

function mod(i: number, n: number): number {
  return ((i % n) + n) % n;
}

/** Row `s` of a diagram (a view, not a copy). */
export function spaceTimeRow(d: SpaceTime, s: number): Uint8Array {
  return d.cells.subarray(s * d.width, (s + 1) * d.width);
}
