import { congruenceClosure, findRoot, type Closure } from "./congruence";
import type { Supercell } from "./supercell";

/**
 * Greedy ascent in the congruence lattice: join θ with Cg of a pair of its classes while the result stays proper.
 * The end point is maximal (a coatom: no proper congruence strictly above it) when `maximal` is true; false means
 * the work limit cut the ascent short.
 */
export function extendToMaximal(
  cell: Supercell,
  start: Closure,
  knownTotal: Uint8Array,
  workLimit: number,
  shouldStop: () => boolean = () => false,
): { closure: Closure; maximal: boolean } {
  let current = start;
  const work = { value: 0 };
  for (;;) {
    if (current.classes <= 2) return { closure: current, maximal: true };
    const reps: number[] = [];
    for (let s = 0; s < cell.n; s++) if (findRoot(current.parent, s) === s) reps.push(s);
    let grown: Closure | null = null;
    search: for (let i = 0; i < reps.length; i++) {
      for (let j = i + 1; j < reps.length; j++) {
        if (shouldStop()) return { closure: current, maximal: false };
        grown = congruenceClosure(cell, current, [[reps[i], reps[j]]], { knownTotal, work, workLimit });
        if (work.value > workLimit) return { closure: current, maximal: false };
        if (grown) break search;
      }
    }
    if (!grown) return { closure: current, maximal: true };
    current = grown;
  }
}
