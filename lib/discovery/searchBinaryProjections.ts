import { complementEca, ecaClassRepresentative } from "./ca/ecaSymmetry";
import { solveZeroRootedProjections, type ProjectionClass } from "./ca/projectionSolver";
import { assertBlock, resolveRule, type RuleOption } from "./ca/ruleInput";
import { transportFrom, transportMap, transportTarget } from "./ca/symmetryTransport";
import { ecaSupercell } from "./ca/supercell";
import { coverageRecord, type Coverage } from "./coverage";
import { makeStopper, type LongRunOptions, type Stopped } from "./stopper";

/** Largest block size the binary-projection search accepts (2^(3N) windows). */
export const MAX_PROJECTION_BLOCK = 7;

export interface BinaryProjectionTarget {
  /** the coarse ECA, as a Wolfram rule number (constant rules 0 and 255 included) */
  target: number;
  /** number of projections onto {0, 1}, using both symbols, whose square commutes with this target */
  count: bigint;
  /** one of them, character s = image of block state s (the BITS notation of `certify projection`) */
  example: string;
}

export interface BinaryProjectionSearch {
  stopped: Stopped;
  block: number;
  /** by target rule number, ascending; empty when stopped */
  targets: BinaryProjectionTarget[];
  coverage: Coverage;
}

/** Zero-rooted classes (p(0) = 0) completed with their complements 1 − p, whose target is complementEca(g). */
function completeClasses(zeroRooted: Map<number, ProjectionClass>): Map<number, { count: bigint; example: number[] }> {
  const all = new Map<number, { count: bigint; example: number[] }>();
  const add = (target: number, count: bigint, example: number[]): void => {
    const entry = all.get(target);
    if (entry) entry.count += count;
    else all.set(target, { count, example });
  };
  for (const c of zeroRooted.values()) add(c.target, c.count, Array.from(c.example));
  for (const c of zeroRooted.values()) add(complementEca(c.target), c.count, Array.from(c.example, (b) => 1 - b));
  return all;
}

/**
 * Every projection of the block-N supercell of a radius-1 CA onto {0, 1} (both symbols used) whose square
 * commutes with some radius-1 binary CA, grouped by that target with exact counts and an example each.
 * ECAs are searched at their symmetry class representative and the results transported.
 */
export function searchBinaryProjections(options: RuleOption & LongRunOptions & { block: number }): BinaryProjectionSearch {
  const rule = resolveRule(options);
  assertBlock(options.block, MAX_PROJECTION_BLOCK);
  const block = options.block;
  const stop = makeStopper(options);
  const label = rule.eca !== null ? `rule ${rule.eca}, block ${block}` : `table k=${rule.table.k}, block ${block}`;
  options.onProgress?.(0, label);
  const rep = rule.eca !== null ? ecaClassRepresentative(rule.eca) : null;
  const cell = rep !== null ? ecaSupercell(rep, block) : rule.supercell(block);
  const zeroRooted = solveZeroRootedProjections(cell, { shouldStop: () => stop() !== null });
  const stopped = stop();
  const coverage = coverageRecord("projections", rule.eca !== null ? [rule.eca] : null, stopped ? [] : [block], stopped, stopped ? label : null);
  if (!zeroRooted || stopped) return { stopped: stopped ?? "cancelled", block, targets: [], coverage };
  const transport = rep !== null && rule.eca !== null ? transportFrom(rep, rule.eca) : "identity";
  const targets: BinaryProjectionTarget[] = [];
  for (const [target, { count, example }] of completeClasses(zeroRooted)) {
    const moved = transportMap({ projection: example, table: [] }, transport, block, false);
    targets.push({ target: transportTarget(target, transport), count, example: moved.projection.join("") });
  }
  targets.sort((a, b) => a.target - b.target);
  options.onProgress?.(1, label);
  return { stopped: null, block, targets, coverage };
}
