import { ecaClassRepresentative } from "./ca/ecaSymmetry";
import { closurePartition, quotientTable } from "./ca/congruence";
import { extendToMaximal } from "./ca/extendToMaximal";
import { scanPrincipalCongruences } from "./ca/principalCongruences";
import { assertBlock, resolveRule, type RuleOption } from "./ca/ruleInput";
import { transportFrom, transportMap } from "./ca/symmetryTransport";
import { ecaSupercell, type Supercell } from "./ca/supercell";
import { coverageRecord, type Coverage } from "./coverage";
import { makeStopper, type LongRunOptions, type Stopped } from "./stopper";

/** Largest block size the congruence search accepts for ECAs (2^(3N) windows, 16.7 million at N = 8). */
export const MAX_CONGRUENCE_BLOCK = 8;

export interface Congruence {
  /** number of coarse symbols (classes) */
  classes: number;
  /** block state → class, classes numbered by first appearance */
  partition: number[];
  /** coarse radius-1 rule over the classes: entry (X·m + Y)·m + Z */
  target: number[];
  /** true when shown that no proper congruence lies strictly above it (false: not shown, or cut short) */
  maximal: boolean;
}

export interface CongruenceSearch {
  stopped: Stopped;
  block: number;
  /** whether a proper congruence exists; null when stopped before an answer */
  exists: boolean | null;
  /** coarsest first (fewest classes), then the finer principal ones */
  congruences: Congruence[];
  coverage: Coverage;
}

/** Work budget (translations) for the ascent from each principal congruence to a maximal one. */
const EXTEND_WORK = 5e7;

function describe(cell: Supercell, partition: number[], maximal: boolean): Congruence {
  return { classes: Math.max(...partition) + 1, partition, target: quotientTable(cell, partition), maximal };
}

/**
 * Proper congruences of the block-N supercell: every distinct principal congruence Cg(x, y) that is proper,
 * plus maximal congruences reached from the coarsest of them, listed coarsest first (at most `limit`).
 */
export function searchCongruences(options: RuleOption & LongRunOptions & { block: number; limit?: number }): CongruenceSearch {
  const rule = resolveRule(options);
  assertBlock(options.block, rule.table.k === 2 ? MAX_CONGRUENCE_BLOCK : 12);
  const block = options.block;
  const limit = options.limit ?? 50;
  const stop = makeStopper(options);
  const label = rule.eca !== null ? `rule ${rule.eca}, block ${block}` : `table k=${rule.table.k}, block ${block}`;
  const rep = rule.eca !== null ? ecaClassRepresentative(rule.eca) : null;
  const cell = rep !== null ? ecaSupercell(rep, block) : rule.supercell(block);
  const scan = scanPrincipalCongruences(cell, {
    shouldStop: (fraction) => {
      options.onProgress?.(fraction * 0.9, label);
      return stop() !== null;
    },
  });
  const stopped = stop();
  if (!scan.complete) {
    const exists = scan.found.size > 0 ? true : null;
    return { stopped, block, exists, congruences: [], coverage: coverageRecord("partitions", rule.eca !== null ? [rule.eca] : null, [], stopped, label) };
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
  const transport = rep !== null && rule.eca !== null ? transportFrom(rep, rule.eca) : "identity";
  const congruences = [...byKey.values()]
    .sort((a, b) => a.classes - b.classes || a.partition.join(",").localeCompare(b.partition.join(",")))
    .slice(0, limit)
    .map((c) => {
      const moved = transportMap({ projection: c.partition, table: c.target }, transport, block, true);
      return { ...c, partition: moved.projection, target: moved.table };
    });
  options.onProgress?.(1, label);
  return {
    stopped: null,
    block,
    exists: scan.found.size > 0,
    congruences,
    coverage: coverageRecord("partitions", rule.eca !== null ? [rule.eca] : null, [block], null, null),
  };
}
