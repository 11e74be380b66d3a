import { createSearchRecord } from "@/db/queries/search";
import { ensureModel, submitCertificate } from "@/server/atlas/submit";
import { isAppError } from "@/server/errors";
import { totalisticTable } from "@/lib/discovery";
import { defineJobKind } from "./types";
import { TotalisticAtlasParams, type TotalisticAtlasOutput } from "./totalistic-atlas.compute";

function totalisticModel(code: number) {
  return { kind: "ca", k: 3, r: 1, table: Array.from(totalisticTable(code).table) };
}

/** The name the atlas lists and searches (README, "Three-state totalistic rules", for the numbering). */
export function totalisticName(code: number): string {
  return `Three-state totalistic code ${code}`;
}

/**
 * The three-state totalistic atlas (DOMAIN.md §2b numbering): proper congruences of the 2,187 codes at block sizes 1
 * and 2, every one submitted as a certificate through the atlas's verified path and one search record per code.
 */
export const totalisticAtlasKind = defineJobKind({
  name: "totalistic-atlas",
  title: "Three-state totalistic atlas",
  paramsSchema: TotalisticAtlasParams,
  compute: "totalistic-atlas",
  timeoutMs: 30 * 60_000,
  computeShare: 0.3,
  example: { minCode: 0, maxCode: 2186, blocks: [1] },
  describe: (params) => {
    const p = TotalisticAtlasParams.safeParse(params);
    return p.success ? `three-state totalistic codes ${p.data.minCode}–${p.data.maxCode}, block ${p.data.blocks.join(" and ")}` : "";
  },
  async persist({ job, output, onProgress, signal }) {
    const result = output as TotalisticAtlasOutput;
    const userId = job.ownerId;
    if (!userId) throw new Error("the job's owner has left the workspace");
    const certificates = { created: 0, existing: 0, refused: [] as { what: string; reason: string }[] };
    let searchRecords = 0;
    let stoppedAt: string | undefined;
    const codes = [...new Set([...result.findings.map((f) => f.code), ...result.records.map((r) => r.code)])].sort((a, b) => a - b);
    for (const [i, code] of codes.entries()) {
      if (signal.aborted) {
        stoppedAt = `code ${code}`;
        break;
      }
      if (i % 32 === 0) onProgress(i / codes.length, `saving code ${code}`);
      // named before its certificates store it, else all 2,187 codes would share the default name "CA k=3, r=1"
      const { model } = await ensureModel({ workspaceId: job.workspaceId, userId, model: totalisticModel(code), naming: { name: totalisticName(code) } });
      for (const finding of result.findings.filter((f) => f.code === code)) {
        try {
          const saved = await submitCertificate({ workspaceId: job.workspaceId, userId, certificate: finding.certificate });
          certificates[saved.status]++;
        } catch (err) {
          if (!isAppError(err)) throw err;
          certificates.refused.push({ what: finding.what, reason: err.message });
        }
      }
      const record = result.records.find((r) => r.code === code);
      if (!record) continue;
      await createSearchRecord({
        workspaceId: job.workspaceId,
        modelId: model.id,
        kind: "congruences",
        maxBlock: record.maxBlock,
        algorithm: result.coverage.algorithm,
        algorithmVersion: result.coverage.version,
        coverage: record.coverage,
        outcome: record.outcome,
        jobId: job.id,
        userId,
      });
      searchRecords++;
    }
    onProgress(1, "saved");
    return { coverage: result.coverage, found: result.findings.length, certificates, searchRecords, skipped: result.skipped, ...(stoppedAt ? { stoppedAt } : {}) };
  },
});
