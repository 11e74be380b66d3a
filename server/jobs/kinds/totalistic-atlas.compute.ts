// Runs in a job worker thread: lib/ only.
import { z } from "zod";
import { certifyProjection, type Certificate } from "@/lib/certificate";
import { buildTotalisticAtlas, totalisticTable, TOTALISTIC_CODES, type Coverage } from "@/lib/discovery";
import { modelAddress } from "@/lib/models";
import type { ComputeContext } from "./types";

export const TotalisticAtlasParams = z
  .strictObject({
    minCode: z.number().int().min(0).max(TOTALISTIC_CODES - 1).default(0),
    maxCode: z.number().int().min(0).max(TOTALISTIC_CODES - 1).default(TOTALISTIC_CODES - 1),
    blocks: z.array(z.union([z.literal(1), z.literal(2)])).min(1).max(2).default([1, 2]),
  })
  .refine((p) => p.minCode <= p.maxCode, { path: ["maxCode"], message: "maxCode must be at least minCode" });
export type TotalisticAtlasParams = z.infer<typeof TotalisticAtlasParams>;

export type TotalisticFinding = { code: number; what: string; certificate: Certificate };
export type TotalisticRecord = { code: number; coverage: Record<string, unknown>; outcome: { targets: string[] } & Record<string, unknown>; maxBlock: number };

export type TotalisticAtlasOutput = {
  findings: TotalisticFinding[];
  records: TotalisticRecord[];
  skipped: string[];
  stopped: "cancelled" | "deadline" | null;
  coverage: Coverage;
};

/**
 * Every proper congruence the search finds for the three-state totalistic codes minCode…maxCode at block sizes 1
 * and/or 2, each certified by the core's checker as a projection onto its classes, and one search record per code
 * (so that "none" is stored too).
 */
export function compute(params: TotalisticAtlasParams, context: ComputeContext): TotalisticAtlasOutput {
  const codes = Array.from({ length: params.maxCode - params.minCode + 1 }, (_, i) => params.minCode + i);
  const blocks = [...new Set(params.blocks)].sort();
  const atlas = buildTotalisticAtlas({ codes, blocks, signal: context.signal, onProgress: (f, item) => context.onProgress(f * 0.8, item) });
  const out: TotalisticAtlasOutput = { findings: [], records: [], skipped: [], stopped: atlas.stopped, coverage: atlas.coverage };
  context.onProgress(0.8, "certifying what was found");
  const targets = new Map<number, { block: number; classes: number; partition: number[]; target: string }[]>();
  for (const row of atlas.rows) {
    const table = totalisticTable(row.code);
    for (const c of row.congruences) {
      const what = `code ${row.code}: ${c.classes} classes at block ${row.block}`;
      const built = certifyProjection({ table, block: row.block, projection: c.partition });
      // The search and the checker are separate programs; a disagreement is reported, never stored.
      if (!built.ok) {
        out.skipped.push(`${what}: the checker found a counterexample`);
        continue;
      }
      out.findings.push({ code: row.code, what, certificate: built.certificate });
      const list = targets.get(row.code) ?? [];
      list.push({ block: row.block, classes: c.classes, partition: c.partition, target: modelAddress(built.certificate.target) });
      targets.set(row.code, list);
    }
  }
  if (atlas.blocks.length === 0) return out;
  for (const code of codes) {
    const found = targets.get(code) ?? [];
    out.records.push({
      code,
      maxBlock: Math.max(...atlas.blocks),
      coverage: { code, numbering: "totalistic k=3 r=1: value for sum s is base-3 digit s of the code", blocks: atlas.blocks, steps: "T = N", exhaustive: true },
      outcome: { targets: [...new Set(found.map((f) => f.target))], properCongruence: found.length > 0, congruences: found },
    });
  }
  return out;
}
