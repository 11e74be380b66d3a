import { evolveCells, type RuleTable } from "@/lib/ca";
import type { Witness } from "./describeCounterexample";

/** One row of a drawn evolution: its cells and how many cells it is indented (each step loses r cells per side). */
export type EvolutionRow = { cells: number[]; indent: number };

/**
 * The fine window of a projection counterexample and its evolution over `steps` steps of the rule;
 * the last row's centre block (cells `centre.from` … `centre.to - 1`) is the block the coarse value is read from.
 */
export function windowEvolution(w: Witness, rule: RuleTable, steps: number): { rows: EvolutionRow[]; centre: { from: number; to: number } } {
  const start = w.cells.join("").split("").map((c) => parseInt(c, 36));
  const rows: EvolutionRow[] = [{ cells: start, indent: 0 }];
  let row: Uint8Array = Uint8Array.from(start);
  for (let s = 1; s <= steps && row.length > 2 * rule.r; s++) {
    row = evolveCells(rule, row, 1);
    rows.push({ cells: Array.from(row), indent: s * rule.r });
  }
  const N = w.imageCells.length;
  const R = (w.window.length - 1) / 2;
  const from = R * N - rows[rows.length - 1].indent;
  return { rows, centre: { from, to: from + N } };
}
