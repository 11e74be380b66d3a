import type { Job } from "@/db/schema";
import { createSearchRecord } from "@/db/queries/search";
import { ensureModel, submitCertificate } from "@/server/atlas/submit";
import { isAppError } from "@/server/errors";
import type { CaFindings } from "./ca-findings.compute";

export type StoredFindings = {
  certificates: { created: number; existing: number; refused: { what: string; reason: string }[] };
  searchRecords: number;
  skipped: string[];
  /** Set when a cancel stopped the saving part way. */
  stoppedAt?: string;
};

/**
 * Saves what a CA search found, rule by rule: every certificate through the atlas's verified path
 * (the server's checker runs again; a refusal is reported, not fatal), then the rule's search
 * record, so that "none found" is stored as well. Stops between rules when cancelled.
 */
export async function storeCaFindings({
  job,
  findings,
  onProgress,
  signal,
}: {
  job: Job;
  findings: CaFindings;
  onProgress: (fraction: number, item: string) => void;
  signal: AbortSignal;
}): Promise<StoredFindings> {
  const userId = job.ownerId;
  if (!userId) throw new Error("the job's owner has left the workspace");
  const stored: StoredFindings = { certificates: { created: 0, existing: 0, refused: [] }, searchRecords: 0, skipped: findings.skipped };
  const rules = [...new Set([...findings.findings.map((f) => f.rule), ...findings.records.map((r) => r.rule)])].sort((a, b) => a - b);
  for (const [i, rule] of rules.entries()) {
    if (signal.aborted) {
      stored.stoppedAt = `rule ${rule}`;
      break;
    }
    onProgress(i / rules.length, `saving rule ${rule}`);
    for (const finding of findings.findings.filter((f) => f.rule === rule)) {
      try {
        const result = await submitCertificate({ workspaceId: job.workspaceId, userId, certificate: finding.certificate });
        stored.certificates[result.status]++;
      } catch (err) {
        if (!isAppError(err)) throw err;
        stored.certificates.refused.push({ what: finding.what, reason: err.message });
      }
    }
    const records = findings.records.filter((r) => r.rule === rule);
    if (records.length === 0) continue;
    const { model } = await ensureModel({ workspaceId: job.workspaceId, userId, model: { kind: "eca", rule } });
    for (const record of records) {
      await createSearchRecord({
        workspaceId: job.workspaceId,
        modelId: model.id,
        kind: record.kind,
        maxBlock: record.maxBlock,
        algorithm: record.algorithm,
        algorithmVersion: record.algorithmVersion,
        coverage: record.coverage,
        outcome: record.outcome,
        jobId: job.id,
        userId,
      });
      stored.searchRecords++;
    }
  }
  onProgress(1, "saved");
  return stored;
}
