import { allProperCongruences } from "./ca/allCongruences";
import { quotientTable } from "./ca/congruence";
import { scanPrincipalCongruences } from "./ca/principalCongruences";
import { assertBlock, assertSteps, resolveRule, type RuleOption } from "./ca/ruleInput";
import type { Congruence } from "./searchCongruences";
import { makeStopper, type LongRunOptions, type Stopped } from "./stopper";

/** Most block states the full listing takes (its lattice can hold every one of Bell(n) partitions). */
export const MAX_LISTED_CONGRUENCE_STATES = 12;

/**
 * Every proper congruence of the block-N supercell (T steps, default N) of a rule of any radius and alphabet,
 * fewest classes first, each with its coarse rule and whether it is maximal (exactly known here).
 */
export function searchAllCongruences(options: RuleOption & LongRunOptions & { block: number; steps?: number }): { stopped: Stopped; congruences: Congruence[] } {
  const rule = resolveRule(options);
  assertBlock(options.block, 12);
  const steps = options.steps ?? options.block;
  assertSteps(steps, options.block);
  const cell = rule.supercell(options.block, steps);
  if (cell.n > MAX_LISTED_CONGRUENCE_STATES) throw new RangeError(`listing every congruence takes at most ${MAX_LISTED_CONGRUENCE_STATES} block states, got ${cell.n}`);
  const stop = makeStopper(options);
  const scan = scanPrincipalCongruences(cell, { shouldStop: () => stop() !== null });
  const lattice = scan.complete ? allProperCongruences(cell, scan, () => stop() !== null) : null;
  if (!lattice) return { stopped: stop() ?? "cancelled", congruences: [] };
  const congruences = [...lattice.values()]
    .map(({ partition, maximal }) => ({ classes: Math.max(...partition) + 1, partition, target: quotientTable(cell, partition), radius: cell.radius, maximal }))
    .sort((a, b) => a.classes - b.classes || a.partition.join(",").localeCompare(b.partition.join(",")));
  return { stopped: null, congruences };
}
