import { ecaClassRepresentative } from "./ca/ecaSymmetry";
import { closurePartition, quotientTable } from "./ca/congruence";
import { extendToMaximal } from "./ca/extendToMaximal";
import { scanPrincipalCongruences } from "./ca/principalCongruences";
import { assertBlock, assertSteps, resolveRule, type RuleOption } from "./ca/ruleInput";
import { transportFrom, transportMap } from "./ca/symmetryTransport";
import { ecaSupercell, type Supercell } from "./ca/supercell";
import { coverageRecord, type Coverage } from "./coverage";
import { makeStopper, type LongRunOptions, type Stopped } from "./stopper";

/** Largest block size the congruence search accepts for ECAs (2^(3N) windows, 134 million at N = 9). */
export const MAX_CONGRUENCE_BLOCK = 9;

export interface Congruence {
  /** number of coarse symbols (classes) */
  classes: number;
  /** block state → class, classes numbered by first appearance */
  partition: number[];
  /** coarse rule over the classes, radius R = ceil(rT / N): table over m^(2R+1) neighbourhoods (DOMAIN.md §1) */
  target: number[];
  /** the coarse radius R */
  radius: number;
  /** true when shown that no proper congruence lies strictly above it (false: not shown, or cut short) */
  maximal: boolean;
}

export interface CongruenceSearch {
  stopped: Stopped;
  block: number;
  steps: number;
  /** whether a proper congruence exists; null when stopped before an answer */
  exists: boolean | null;
  /** coarsest first (fewest classes), then the finer principal ones */
  congruences: Congruence[];
  coverage: Coverage;
}

/** Work budget (translations) for the ascent from each principal congruence to a maximal one. */
const EXTEND_WORK = 5e7;

function describe(cell: Supercell, partition: number[], maximal: boolean): Congruence {
  return { classes: Math.max(...partition) + 1, partition, target: quotientTable(cell, partition), radius: cell.radius, maximal };
}

/**
 * Proper congruences of the block-N supercell (T steps, default N; a source of any radius): every distinct principal congruence Cg(x, y) that is proper,
 * plus maximal congruences reached from the coarsest of them, listed coarsest first (at most `limit`).
 */
export function searchCongruences(options: RuleOption & LongRunOptions & { block: number; steps?: number; limit?: number }): CongruenceSearch {
  const rule = resolveRule(options);
  assertBlock(options.block, rule.table.k === 2 ? MAX_CONGRUENCE_BLOCK : 12);
  const block = options.block;
  const steps = options.steps ?? block;
  assertSteps(steps, block);
  const limit = options.limit ?? 50;
  const stop = makeStopper(options);
  const what = rule.eca !== null ? `rule ${rule.eca}` : `table k=${rule.table.k} r=${rule.table.r}`;
  const label = `${what}, block ${block}${steps === block ? "" : `, ${steps} steps`}`;
  // symmetry transport is for radius-1 ECA results; other sources and step counts are searched as given
  const rep = rule.eca !== null && steps === block ? ecaClassRepresentative(rule.eca) : null;
  const cell = rep !== null ? ecaSupercell(rep, block) : rule.supercell(block, steps);
  const scan = scanPrincipalCongruences(cell, {
    shouldStop: (fraction) => {
      options.onProgress?.(fraction * 0.9, label);
      return stop() !== null;
    },
  });
  const stopped = stop();
  if (!scan.complete) {
    const exists = scan.found.size > 0 ? true : null;
    return { stopped, block, steps, exists, congruences: [], coverage: coverageRecord("partitions", rule.eca !== null ? [rule.eca] : null, [], stopped, label) };
  }
  const principal = [...scan.found.values()].sort((a, b) => a.closure.classes - b.closure.classes);
  const byKey = new Map<string, Congruence>();
  for (const entry of principal.slice(0, 8)) {
    const { closure, maximal } = extendToMaximal(cell, entry.closure, scan.knownTotal, EXTEND_WORK, () => stop() !== null);
    const partition = closurePartition(closure);
    byKey.set(partition.join(","), describe(cell, partition, maximal));
  }
  for (const entry of principal) {
    const key = entry.partition.join(",");
    if (!byKey.has(key)) byKey.set(key, describe(cell, entry.partition, false));
  }
  const transport = rep !== null ? transportFrom(rep, rule.eca as number) : "identity";
  const congruences = [...byKey.values()]
    .sort((a, b) => a.classes - b.classes || a.partition.join(",").localeCompare(b.partition.join(",")))
    .slice(0, limit)
    .map((c) => {
      if (rep === null) return c;
      const moved = transportMap({ projection: c.partition, table: c.target }, transport, block, true);
      return { ...c, partition: moved.projection, target: moved.table };
    });
  options.onProgress?.(1, label);
  return {
    stopped: null,
    block,
    steps,
    exists: scan.found.size > 0,
    congruences,
    coverage: coverageRecord("partitions", rule.eca !== null ? [rule.eca] : null, [block], null, null),
  };
}
