import { complementEca, ecaClassRepresentative } from "./ca/ecaSymmetry";
import { solveZeroRootedProjections, type ProjectionClass } from "./ca/projectionSolver";
import { assertBlock, assertSteps, resolveRule, type RuleOption } from "./ca/ruleInput";
import { transportFrom, transportMap, transportTarget } from "./ca/symmetryTransport";
import { ecaSupercell, type Supercell } from "./ca/supercell";
import { onDemandApplies, solveZeroRootedOnDemand } from "./ca/onDemandProjectionSolver";
import { solveZeroRootedWide, type WideProjectionClass } from "./ca/wideProjectionSolver";
import { wideRadius } from "./ca/wideSupercell";
import { coverageRecord, type Coverage } from "./coverage";
import { makeStopper, type LongRunOptions, type Stopped } from "./stopper";

/** Largest block size the binary-projection search accepts (2^(3N) windows). */
export const MAX_PROJECTION_BLOCK = 7;

/** A coarse rule as DOMAIN.md §2b writes it: alphabet, radius, table (index as in §1). */
export interface CoarseRule {
  k: number;
  r: number;
  table: number[];
}

export interface BinaryProjectionTarget {
  /** the coarse ECA, as a Wolfram rule number (constant rules 0 and 255 included); null when the coarse radius is above 1 */
  target: number | null;
  /** the coarse rule in full: k = 2, radius R = ceil(rT / N) */
  coarse: CoarseRule;
  /** number of projections onto {0, 1}, using both symbols, whose square commutes with this target */
  count: bigint;
  /** one of them, character s = image of block state s (the BITS notation of `certify projection`) */
  example: string;
}

export interface BinaryProjectionSearch {
  stopped: Stopped;
  block: number;
  steps: number;
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

function eca(table: number[]): number | null {
  return table.length === 8 ? table.reduce((t, bit, m) => t | (bit << m), 0) : null;
}

function bitsOf(rule: number): number[] {
  return Array.from({ length: 8 }, (_, m) => (rule >> m) & 1);
}

/** Radius-1 ECA results by target number → rows with the coarse rule written out. */
function ecaTargets(all: Map<number, { count: bigint; example: number[] }>, transport: ReturnType<typeof transportFrom> | "identity", block: number): BinaryProjectionTarget[] {
  const targets: BinaryProjectionTarget[] = [];
  for (const [target, { count, example }] of all) {
    const moved = transportMap({ projection: example, table: [] }, transport, block, false);
    const rule = transportTarget(target, transport);
    targets.push({ target: rule, coarse: { k: 2, r: 1, table: bitsOf(rule) }, count, example: moved.projection.join("") });
  }
  return targets;
}

/**
 * Projections of a supercell of radius R > 1 (or any supercell with T ≠ N): the zero-rooted ones listed by a
 * solver (on demand, or over the table), completed with their complements, whose coarse table is g'(x) = 1 − g(complement of x).
 */
function wideTargets(radius: number, zeroRooted: () => Iterable<WideProjectionClass> | null | undefined): BinaryProjectionTarget[] | null {
  const zero = zeroRooted();
  if (!zero) return null;
  const all = new Map<string, { table: number[]; count: bigint; example: number[] }>();
  const add = (table: number[], count: bigint, example: number[]) => {
    const key = table.join("");
    const entry = all.get(key);
    if (entry) entry.count += count;
    else all.set(key, { table, count, example });
  };
  const classes = [...zero];
  for (const c of classes) add(Array.from(c.table), c.count, Array.from(c.example));
  for (const c of classes) {
    const size = c.table.length;
    add(Array.from({ length: size }, (_, x) => 1 - c.table[size - 1 - x]), c.count, Array.from(c.example, (b) => 1 - b));
  }
  return [...all.values()].map(({ table, count, example }) => ({ target: eca(table), coarse: { k: 2, r: radius, table }, count, example: example.join("") }));
}

/** The radius-1 model-counting solver's classes in the wide solver's shape. */
function radiusOneAsWide(cell: Supercell, shouldStop: () => boolean): { table: Uint8Array; count: bigint; example: Uint8Array }[] | null {
  const zero = solveZeroRootedProjections(cell, { shouldStop });
  if (!zero) return null;
  return [...zero.values()].map((c) => ({ table: Uint8Array.from(bitsOf(c.target)), count: c.count, example: c.example }));
}

function compareTables(a: BinaryProjectionTarget, b: BinaryProjectionTarget): number {
  const x = a.coarse.table;
  const y = b.coarse.table;
  for (let i = x.length - 1; i >= 0; i--) if (x[i] !== y[i]) return x[i] - y[i];
  return 0;
}

/**
 * Every projection of the block-N supercell (T steps, default N) of a CA of any radius onto {0, 1} (both symbols
 * used) whose square commutes with some binary CA of radius R = ceil(rT / N), grouped by that target with exact
 * counts and an example each. ECAs with T = N are searched at their symmetry class representative and the
 * results transported; every other source is searched as given.
 */
export function searchBinaryProjections(options: RuleOption & LongRunOptions & { block: number; steps?: number }): BinaryProjectionSearch {
  const rule = resolveRule(options);
  assertBlock(options.block, MAX_PROJECTION_BLOCK);
  const block = options.block;
  const steps = options.steps ?? block;
  assertSteps(steps, block);
  const stop = makeStopper(options);
  const shouldStop = () => stop() !== null;
  const what = rule.eca !== null ? `rule ${rule.eca}` : `table k=${rule.table.k} r=${rule.table.r}`;
  const label = `${what}, block ${block}${steps === block ? "" : `, ${steps} steps`}`;
  options.onProgress?.(0, label);
  const classic = rule.eca !== null && steps === block;
  let targets: BinaryProjectionTarget[] | null;
  if (classic) {
    const rep = ecaClassRepresentative(rule.eca as number);
    const zeroRooted = solveZeroRootedProjections(ecaSupercell(rep, block), { shouldStop });
    targets = zeroRooted ? ecaTargets(completeClasses(zeroRooted), transportFrom(rep, rule.eca as number), block) : null;
  } else if (wideRadius(rule.table.r, block, steps) > 1 && onDemandApplies(rule.table, block, steps)) {
    targets = wideTargets(wideRadius(rule.table.r, block, steps), () => solveZeroRootedOnDemand(rule.table, block, steps, { shouldStop })?.values());
  } else {
    const cell = rule.supercell(block, steps);
    targets = wideTargets(cell.radius, () => (cell.radius === 1 ? radiusOneAsWide(cell, shouldStop) : solveZeroRootedWide(cell, { shouldStop })?.values()));
  }
  const stopped = stop() ?? (targets ? null : "cancelled");
  const coverage = coverageRecord("projections", rule.eca !== null ? [rule.eca] : null, stopped ? [] : [block], stopped, stopped ? label : null);
  if (!targets || stopped) return { stopped: stopped ?? "cancelled", block, steps, targets: [], coverage };
  targets.sort(compareTables);
  options.onProgress?.(1, label);
  return { stopped: null, block, steps, targets, coverage };
}
