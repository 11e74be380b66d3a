import type { Database } from "@/db/client";
import { closeVerificationPool } from "@/server/atlas/pool";
import { createInProcessQueue } from "@/server/jobs/in-process-queue";
import { createJobRunner } from "@/server/jobs/job-runner";
import "@/server/jobs/kinds";
import type { EcaAtlasParams } from "@/server/jobs/kinds/eca-atlas.compute";

/** The atlas the hierarchy must stay readable with: every binary projection of all 256 ECAs at block sizes 2–4. */
export const FULL_ECA_ATLAS: EcaAtlasParams = { minBlock: 2, maxBlock: 4, search: "projections" };

/**
 * Builds an ECA atlas into a workspace through the same job path as a user's "ECA atlas" job (and the
 * demo seed): queued, run to completion by the job runner in this process, every finding certified.
 * Returns the job's result (found, certificates created, search records).
 */
export async function seedEcaAtlas({
  db,
  workspaceId,
  userId,
  params = FULL_ECA_ATLAS,
}: {
  db: Database;
  workspaceId: string;
  userId: string;
  params?: EcaAtlasParams;
}): Promise<{ found: number; certificates: { created: number } }> {
  const queue = createInProcessQueue({ db, perUserLimit: 100 });
  const job = await queue.enqueue({ workspaceId, ownerId: userId, kind: "eca-atlas", params });
  const runner = createJobRunner({ db, workers: 1 });
  try {
    await runner.drain();
  } finally {
    await runner.stop();
    await closeVerificationPool();
  }
  const finished = await queue.get({ jobId: job.id, workspaceId });
  if (finished?.status !== "succeeded") throw new Error(`the ECA atlas job ended ${finished?.status}: ${finished?.error}`);
  return finished.result as { found: number; certificates: { created: number } };
}
