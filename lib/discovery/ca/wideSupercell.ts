/**
 * Search-side supercell of any CA (k symbols, radius r) at block N with T steps (DOMAIN.md §2b): a CA on k^N block
 * states of radius R = ceil(rT / N). Each output cell of the centre block depends on a light cone of 2rT + 1
 * cells, so one table of f^T on 2rT + 1 cells gives every output cell by a lookup (the checker computes its own
 * table the plain way).
 */
import { CaInputError, type RuleTable } from "@/lib/ca";
import { tableArray, type Supercell } from "./supercell";

/** Largest window count (n^(2R+1)) and light-cone table (k^(2rT+1)) the search builds. */
export const MAX_WIDE_WINDOWS = 2 ** 25;
export const MAX_CONE_CELLS = 2 ** 24;

/** f^T on every pattern of 2rT + 1 cells (pattern read as a base-k number, leftmost most significant). */
function coneTable(t: RuleTable, steps: number): Uint8Array {
  const { k, r, table } = t;
  const width = 2 * r * steps + 1;
  const size = k ** width;
  const cone = new Uint8Array(size);
  const cells = new Uint8Array(width);
  const span = 2 * r + 1;
  for (let x = 0; x < size; x++) {
    let rest = x;
    for (let i = width - 1; i >= 0; i--) {
      cells[i] = rest % k;
      rest = Math.floor(rest / k);
    }
    for (let s = 0, w = width; s < steps; s++, w -= 2 * r) {
      for (let i = 0; i + span <= w; i++) {
        let idx = 0;
        for (let d = 0; d < span; d++) idx = idx * k + cells[i + d];
        cells[i] = table[idx];
      }
    }
    cone[x] = cells[0];
  }
  return cone;
}

/** Radius of the supercell CA: R = ceil(rT / N) (DOMAIN.md §2). */
export function wideRadius(r: number, block: number, steps: number): number {
  return Math.ceil((r * steps) / block);
}

/** Supercell of `t` at block N with T steps, as a radius-R CA on k^N states. */
export function wideSupercell(t: RuleTable, block: number, steps: number): Supercell {
  const { k, r } = t;
  const N = block;
  if (!Number.isInteger(steps) || steps < 1) throw new CaInputError("steps", `steps must be a positive integer, got ${steps}`);
  const R = wideRadius(r, N, steps);
  const n = k ** N;
  const width = 2 * R + 1;
  const windows = n ** width;
  if (windows > MAX_WIDE_WINDOWS)
    throw new CaInputError("block", `(k^N)^(2R+1) = ${windows} windows (k=${k}, N=${N}, R=${R}) is beyond the search's table size ${MAX_WIDE_WINDOWS}`);
  const coneCells = 2 * r * steps + 1;
  if (k ** coneCells > MAX_CONE_CELLS) throw new CaInputError("steps", `a light cone of ${coneCells} cells over ${k} symbols is beyond the search's table size`);
  const cone = coneTable(t, steps);
  const coneSize = k ** coneCells;
  const cellsInWindow = width * N;
  // output cell j of the centre block is window cell RN + j; its cone ends at cell RN + j + rT
  const divisor = Array.from({ length: N }, (_, j) => k ** (cellsInWindow - 1 - (R * N + j + r * steps)));
  const out = tableArray(n, windows);
  if (k === 2 && cellsInWindow <= 30) {
    // binary windows are bit strings (leftmost cell most significant): each cone is a shifted, masked slice
    const shift = divisor.map((d) => Math.log2(d));
    const mask = coneSize - 1;
    for (let w = 0; w < windows; w++) {
      let v = 0;
      for (let j = 0; j < N; j++) v = (v << 1) | cone[(w >>> shift[j]) & mask];
      out[w] = v;
    }
    return { n, radius: R, out };
  }
  for (let w = 0; w < windows; w++) {
    let v = 0;
    for (let j = 0; j < N; j++) v = v * k + cone[Math.floor(w / divisor[j]) % coneSize];
    out[w] = v;
  }
  return { n, radius: R, out };
}
