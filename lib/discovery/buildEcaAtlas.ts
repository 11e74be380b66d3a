import { ecaClasses } from "./ca/ecaClasses";
import { closurePartition, quotientTable } from "./ca/congruence";
import { extendToMaximal } from "./ca/extendToMaximal";
import { scanPrincipalCongruences } from "./ca/principalCongruences";
import { solveZeroRootedProjections } from "./ca/projectionSolver";
import { complementEca } from "./ca/ecaSymmetry";
import { transportFrom, transportMap, transportTarget } from "./ca/symmetryTransport";
import { ecaSupercell } from "./ca/supercell";
import { CaInputError } from "@/lib/ca";
import { coverageRecord, type Coverage } from "./coverage";
import { makeStopper, type LongRunOptions, type Stopped } from "./stopper";
import { MAX_PROJECTION_BLOCK } from "./searchBinaryProjections";
import { MAX_CONGRUENCE_BLOCK } from "./searchCongruences";

export interface ProjectionAtlasRow {
  rule: number;
  /** smallest rule of the rule's symmetry class */
  symmetryClass: number;
  block: number;
  target: number;
  count: bigint;
  example: string;
}

export interface PartitionAtlasRow {
  rule: number;
  symmetryClass: number;
  /** smallest block size with a proper congruence, or null: none up to maxBlock */
  block: number | null;
  classes: number | null;
  partition: number[] | null;
  target: number[] | null;
  /** the reported congruence was shown maximal */
  maximal: boolean;
}

export type EcaAtlas =
  | { kind: "projections"; stopped: Stopped; rows: ProjectionAtlasRow[]; coverage: Coverage }
  | { kind: "partitions"; stopped: Stopped; rows: PartitionAtlasRow[]; coverage: Coverage };

export interface EcaAtlasOptions extends LongRunOptions {
  maxBlock: number;
  kind: "projections" | "partitions";
  /** @default 2 */
  minBlock?: number;
}

const EXTEND_WORK = 2e7;

/**
 * The ECA atlas over block sizes minBlock … maxBlock: every binary projection by target, or for each rule the
 * smallest block size with a proper congruence. Each of the 88 symmetry classes is searched once at its
 * representative and the results are transported to the other members.
 */
export function buildEcaAtlas(options: EcaAtlasOptions): EcaAtlas {
  const minBlock = options.minBlock ?? 2;
  const limit = options.kind === "projections" ? MAX_PROJECTION_BLOCK : MAX_CONGRUENCE_BLOCK;
  if (!Number.isInteger(options.maxBlock) || options.maxBlock < minBlock || options.maxBlock > limit)
    throw new CaInputError("maxBlock", `max block must be an integer from ${minBlock} to ${limit} for ${options.kind}, got ${options.maxBlock}`);
  return options.kind === "projections" ? projectionAtlas(options, minBlock) : partitionAtlas(options, minBlock);
}

function blockRange(from: number, to: number): number[] {
  return Array.from({ length: to - from + 1 }, (_, i) => from + i);
}

function projectionAtlas(options: EcaAtlasOptions, minBlock: number): EcaAtlas {
  const stop = makeStopper(options);
  const classes = ecaClasses();
  const blocks = blockRange(minBlock, options.maxBlock);
  const weight = (N: number) => 8 ** N;
  const total = blocks.reduce((s, N) => s + weight(N) * classes.length, 0);
  let done = 0;
  const rows: ProjectionAtlasRow[] = [];
  const covered: number[] = [];
  for (const N of blocks) {
    for (const { representative: rep, members } of classes) {
      const item = `block ${N}, rule ${rep}`;
      options.onProgress?.(done / total, item);
      const zero = solveZeroRootedProjections(ecaSupercell(rep, N), { shouldStop: () => stop() !== null });
      const stopped = stop();
      if (!zero || stopped) return { kind: "projections", stopped: stopped ?? "cancelled", rows: sortProjectionRows(rows), coverage: coverageRecord("projections", range256(), covered, stopped, item) };
      const all = new Map<number, { count: bigint; example: number[] }>();
      const add = (t: number, c: bigint, e: number[]) => {
        const entry = all.get(t);
        if (entry) entry.count += c;
        else all.set(t, { count: c, example: e });
      };
      for (const c of zero.values()) add(c.target, c.count, Array.from(c.example));
      for (const c of zero.values()) add(complementEca(c.target), c.count, Array.from(c.example, (b) => 1 - b));
      for (const rule of members) {
        const transport = transportFrom(rep, rule);
        for (const [target, { count, example }] of all) {
          const moved = transportMap({ projection: example, table: [] }, transport, N, false);
          rows.push({ rule, symmetryClass: rep, block: N, target: transportTarget(target, transport), count, example: moved.projection.join("") });
        }
      }
      done += weight(N);
    }
    covered.push(N);
  }
  options.onProgress?.(1, "done");
  return { kind: "projections", stopped: null, rows: sortProjectionRows(rows), coverage: coverageRecord("projections", range256(), covered, null, null) };
}

function sortProjectionRows(rows: ProjectionAtlasRow[]): ProjectionAtlasRow[] {
  return rows.sort((a, b) => a.rule - b.rule || a.block - b.block || a.target - b.target);
}

function range256(): number[] {
  return Array.from({ length: 256 }, (_, i) => i);
}

function partitionAtlas(options: EcaAtlasOptions, minBlock: number): EcaAtlas {
  const stop = makeStopper(options);
  const classes = ecaClasses();
  const blocks = blockRange(minBlock, options.maxBlock);
  const rows: PartitionAtlasRow[] = [];
  // sweep block by block, so that a stop leaves every rule covered up to the same block size
  const open = new Set(classes.map((c) => c.representative));
  const covered: number[] = [];
  const weight = (N: number) => 8 ** N;
  const total = blocks.reduce((s, N) => s + weight(N), 0);
  let doneWeight = 0;
  for (const N of blocks) {
    const reps = classes.filter((c) => open.has(c.representative));
    for (let i = 0; i < reps.length; i++) {
      const { representative: rep, members } = reps[i];
      const item = `block ${N}, rule ${rep}`;
      options.onProgress?.((doneWeight + (weight(N) * i) / reps.length) / total, item);
      const cell = ecaSupercell(rep, N);
      const scan = scanPrincipalCongruences(cell, { first: true, shouldStop: () => stop() !== null });
      const stopped = stop();
      if (stopped) return { kind: "partitions", stopped, rows: finishPartitionRows(rows, classes, open), coverage: coverageRecord("partitions", range256(), covered, stopped, item) };
      const first = [...scan.found.values()][0];
      if (!first) continue;
      open.delete(rep);
      const { closure, maximal } = extendToMaximal(cell, first.closure, scan.knownTotal, EXTEND_WORK);
      const partition = closurePartition(closure);
      const table = quotientTable(cell, partition);
      for (const rule of members) {
        const moved = transportMap({ projection: partition, table }, transportFrom(rep, rule), N, true);
        rows.push({ rule, symmetryClass: rep, block: N, classes: closure.classes, partition: moved.projection, target: moved.table, maximal });
      }
    }
    doneWeight += weight(N);
    covered.push(N);
  }
  options.onProgress?.(1, "done");
  return { kind: "partitions", stopped: null, rows: finishPartitionRows(rows, classes, open), coverage: coverageRecord("partitions", range256(), covered, null, null) };
}

function finishPartitionRows(rows: PartitionAtlasRow[], classes: { representative: number; members: number[] }[], open: Set<number>): PartitionAtlasRow[] {
  for (const { representative, members } of classes) {
    if (!open.has(representative)) continue;
    for (const rule of members) rows.push({ rule, symmetryClass: representative, block: null, classes: null, partition: null, target: null, maximal: false });
  }
  return rows.sort((a, b) => a.rule - b.rule);
}
