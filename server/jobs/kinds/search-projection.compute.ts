// Runs in a job worker thread: lib/ only.
import { z } from "zod";
import { coverageRecord, searchBinaryProjections, searchCongruences, type PartitionAtlasRow, type ProjectionAtlasRow, type Coverage } from "@/lib/discovery";
import { partitionFindings, projectionFindings, stepsProjectionFindings, type CaFindings, type StepsProjectionRow } from "./ca-findings.compute";
import type { ComputeContext } from "./types";

export const SearchProjectionParams = z
  .strictObject({
    rule: z.number().int().min(0).max(255).meta({ description: "ECA rule number (Wolfram code)." }),
    minBlock: z.number().int().min(2).max(6).default(2),
    maxBlock: z.number().int().min(2).max(6).default(4),
    search: z.enum(["projections", "partitions", "both"]).default("both"),
    steps: z.number().int().min(1).max(12).optional().meta({ description: "Steps T per coarse step at every block size (1 ≤ T ≤ 2N; DOMAIN.md §2b); absent: T = N." }),
  })
  .refine((p) => p.minBlock <= p.maxBlock, { path: ["maxBlock"], message: "maxBlock must be at least minBlock" })
  .refine((p) => p.steps === undefined || p.steps <= 2 * p.minBlock, { path: ["steps"], message: "steps must be at most 2N for the smallest block size" })
  // a radius-2 coarse rule's check reads (2^N)^5 windows: N = 4 is 2^20, within the checker's bounds
  .refine((p) => p.steps === undefined || p.maxBlock <= 4, { path: ["maxBlock"], message: "maxBlock is at most 4 when steps is given" });
export type SearchProjectionParams = z.infer<typeof SearchProjectionParams>;

export type SearchProjectionOutput = CaFindings & { stopped: "cancelled" | "deadline" | null; coverage: Coverage[] };

const range = (from: number, to: number) => Array.from({ length: to - from + 1 }, (_, i) => from + i);

/** One ECA over block sizes minBlock…maxBlock: every binary projection by target, and/or the first proper congruence. */
export function compute(params: SearchProjectionParams, context: ComputeContext): SearchProjectionOutput {
  const out: SearchProjectionOutput = { findings: [], records: [], skipped: [], stopped: null, coverage: [] };
  const blocks = range(params.minBlock, params.maxBlock);
  const wants = (kind: "projections" | "partitions") => params.search === kind || params.search === "both";
  const kindCount = params.search === "both" ? 2 : 1;
  // Work grows as 8^N (2^(3N) windows), so progress is weighted by it.
  const weight = blocks.map((N) => 8 ** N);
  const total = weight.reduce((a, b) => a + b, 0) * kindCount;
  let done = 0;
  const progress = (w: number) => (f: number, item: string) => context.onProgress((done + f * w) / total, item);

  if (wants("projections") && params.steps !== undefined) {
    const rows: StepsProjectionRow[] = [];
    const covered: number[] = [];
    for (const [i, block] of blocks.entries()) {
      const search = searchBinaryProjections({ rule: params.rule, block, steps: params.steps, signal: context.signal, onProgress: progress(weight[i]) });
      done += weight[i];
      if (search.stopped) {
        out.stopped = search.stopped;
        break;
      }
      covered.push(block);
      rows.push({ block, targets: search.targets });
    }
    const coverage = coverageRecord("projections", [params.rule], covered, out.stopped, out.stopped ? `rule ${params.rule}` : null);
    out.coverage.push(coverage);
    stepsProjectionFindings(params.rule, params.steps, rows, coverage, out);
    if (out.stopped) return out;
  } else if (wants("projections")) {
    const rows: ProjectionAtlasRow[] = [];
    const covered: number[] = [];
    for (const [i, block] of blocks.entries()) {
      const search = searchBinaryProjections({ rule: params.rule, block, signal: context.signal, onProgress: progress(weight[i]) });
      done += weight[i];
      if (search.stopped) {
        out.stopped = search.stopped;
        break;
      }
      covered.push(block);
      // T = N for an ECA: every coarse rule is radius 1, an ECA with a rule number
      for (const t of search.targets) if (t.target !== null) rows.push({ rule: params.rule, symmetryClass: -1, block, target: t.target, count: t.count, example: t.example });
    }
    const coverage = coverageRecord("projections", [params.rule], covered, out.stopped, out.stopped ? `rule ${params.rule}` : null);
    out.coverage.push(coverage);
    projectionFindings(rows, [params.rule], coverage, out);
    if (out.stopped) return out;
  }

  if (wants("partitions")) {
    let row: PartitionAtlasRow = { rule: params.rule, symmetryClass: -1, block: null, classes: null, partition: null, target: null, maximal: false };
    const covered: number[] = [];
    for (const [i, block] of blocks.entries()) {
      const search = searchCongruences({ rule: params.rule, block, steps: params.steps, signal: context.signal, onProgress: progress(weight[i]) });
      done += weight[i];
      if (search.stopped) {
        out.stopped = search.stopped;
        break;
      }
      covered.push(block);
      const coarsest = search.congruences[0];
      if (coarsest) {
        row = { ...row, block, classes: coarsest.classes, partition: coarsest.partition, target: coarsest.target, maximal: coarsest.maximal };
        break;
      }
    }
    const coverage = coverageRecord("partitions", [params.rule], covered, out.stopped, out.stopped ? `rule ${params.rule}` : null);
    out.coverage.push(coverage);
    if (covered.length > 0) partitionFindings([row], params.minBlock, coverage, out, params.steps);
  }
  return out;
}
