// Runs in a job worker thread: lib/ only.
import { z } from "zod";
import { checkProjection, supercellTable } from "@/lib/ca";
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
 * A code/block with at most this many proper congruences has a certificate (an atlas map) for each; above it, as
 * many of the maximal ones, fewest classes first. Some codes have all 21,145 proper partitions of the nine block states as congruences (their
 * block-2 supercell is constant), over a million across the atlas: every one is checked by the core's checker and
 * listed in the code's search record, but a map for each would swamp the atlas.
 */
export const MAPS_PER_BLOCK = 64;

/**
 * Every proper congruence of the three-state totalistic codes minCode…maxCode at block sizes 1 and/or 2, each
 * checked by the core's checker as a projection onto its classes; certificates for those that become maps (see
 * MAPS_PER_BLOCK), and one search record per code listing them all (so that "none" is stored too).
 */
export function compute(params: TotalisticAtlasParams, context: ComputeContext): TotalisticAtlasOutput {
  const codes = Array.from({ length: params.maxCode - params.minCode + 1 }, (_, i) => params.minCode + i);
  const blocks = [...new Set(params.blocks)].sort();
  const atlas = buildTotalisticAtlas({ codes, blocks, signal: context.signal, onProgress: (f, item) => context.onProgress(f * 0.8, item) });
  const out: TotalisticAtlasOutput = { findings: [], records: [], skipped: [], stopped: atlas.stopped, coverage: atlas.coverage };
  context.onProgress(0.8, "certifying what was found");
  const targets = new Map<number, { block: number; classes: number; partition: number[]; target: string }[]>();
  const proper = new Map<number, { block: number; partitions: string[]; maximal: string[] }[]>();
  for (const row of atlas.rows) {
    const table = totalisticTable(row.code);
    const listed = { block: row.block, partitions: [] as string[], maximal: [] as string[] };
    proper.set(row.code, [...(proper.get(row.code) ?? []), listed]);
    const mapAll = row.congruences.length <= MAPS_PER_BLOCK;
    let mapped = 0;
    const supercell = supercellTable(table, row.block);
    for (const c of row.congruences) {
      const what = `code ${row.code}: ${c.classes} classes at block ${row.block}`;
      // The search and the checker are separate programs; a disagreement is reported, never stored.
      const check = checkProjection(table, row.block, c.partition, { supercell });
      if (!check.ok || check.coarse.table.join(",") !== c.target.join(",")) {
        out.skipped.push(`${what}: the checker found a counterexample`);
        continue;
      }
      listed.partitions.push(c.partition.join(""));
      if (c.maximal) listed.maximal.push(c.partition.join(""));
      if ((!mapAll && !c.maximal) || mapped >= MAPS_PER_BLOCK) continue;
      mapped++;
      const built = certifyProjection({ table, block: row.block, projection: c.partition });
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
      outcome: {
        targets: [...new Set(found.map((f) => f.target))],
        properCongruence: found.length > 0,
        congruences: found,
        // every proper congruence per block size, checked by checkProjection, fewest classes first, and the maximal
        // ones; a partition is a digit string, digit s the class of block state s
        proper: proper.get(code) ?? [],
      },
    });
  }
  return out;
}
