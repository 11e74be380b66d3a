// Runs in a job worker thread: lib/ only.
import { z } from "zod";
import { buildEcaAtlas, type Coverage } from "@/lib/discovery";
import { partitionFindings, projectionFindings, type CaFindings } from "./ca-findings.compute";
import type { ComputeContext } from "./types";

export const EcaAtlasParams = z
  .strictObject({
    minBlock: z.number().int().min(2).max(9).default(2),
    maxBlock: z.number().int().min(2).max(9).default(3),
    search: z.enum(["projections", "partitions", "both"]).default("projections"),
  })
  .refine((p) => p.minBlock <= p.maxBlock, { path: ["maxBlock"], message: "maxBlock must be at least minBlock" })
  // the congruence sweep reaches N = 9 (the smallest-block table); binary projections stop at 5 in a job
  .refine((p) => p.search === "partitions" || p.maxBlock <= 5, { path: ["maxBlock"], message: "maxBlock is at most 5 for projections (9 for partitions alone)" });
export type EcaAtlasParams = z.infer<typeof EcaAtlasParams>;

export type EcaAtlasOutput = CaFindings & { stopped: "cancelled" | "deadline" | null; coverage: Coverage[] };

const ALL_RULES = Array.from({ length: 256 }, (_, rule) => rule);

/** All 256 ECAs (88 symmetry classes searched, results transported), block sizes minBlock…maxBlock. */
export function compute(params: EcaAtlasParams, context: ComputeContext): EcaAtlasOutput {
  const kinds = params.search === "both" ? (["projections", "partitions"] as const) : ([params.search] as const);
  const out: EcaAtlasOutput = { findings: [], records: [], skipped: [], stopped: null, coverage: [] };
  for (const [i, kind] of kinds.entries()) {
    const share = (f: number) => (i + f * 0.9) / kinds.length;
    const atlas = buildEcaAtlas({
      kind,
      minBlock: params.minBlock,
      maxBlock: params.maxBlock,
      signal: context.signal,
      onProgress: (f, item) => context.onProgress(share(f), `${kind}: ${item}`),
    });
    out.coverage.push(atlas.coverage);
    context.onProgress(share(1), `${kind}: certifying what was found`);
    if (atlas.kind === "projections") projectionFindings(atlas.rows, ALL_RULES, atlas.coverage, out);
    else partitionFindings(atlas.rows, params.minBlock, atlas.coverage, out);
    if (atlas.stopped) {
      out.stopped = atlas.stopped;
      break;
    }
  }
  return out;
}
