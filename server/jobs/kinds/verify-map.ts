import { createCertifiedEdge } from "@/db/queries/maps";
import { env } from "@/env";
import type { VerifyOutcome } from "@/server/atlas/verify-task";
import { AppError } from "@/server/errors";
import { defineJobKind } from "./types";
import { VerifyMapParams } from "./verify-map.compute";

/**
 * One map whose check is too large for a request (the workbench starts it after a 413): built and
 * checked in a job worker with the job's larger bounds, then written as the atlas writes any map (one
 * transaction). A square that fails ends the job with its counterexample in the result.
 */
export const verifyMapKind = defineJobKind({
  name: "verify-map",
  title: "Map check",
  paramsSchema: VerifyMapParams,
  compute: "verify-map",
  timeoutMs: 10 * 60_000,
  computeShare: 0.9,
  example: { build: { kind: "projection", rule: 105, block: 2, projection: [0, 1, 1, 0] } },
  describe: (params) => {
    const p = VerifyMapParams.safeParse(params);
    return p.success ? `a ${p.data.build.kind}` : "";
  },
  async persist({ job, output, onProgress }) {
    const outcome = output as VerifyOutcome;
    if (outcome.status === "fails") return { ok: false, message: "The square does not commute; nothing was written.", counterexample: outcome.counterexample };
    if (outcome.status === "too-large") throw new AppError("too_large", `The check exceeds a job's limit on ${outcome.bound}: ${outcome.asked} > ${outcome.limit}.`);
    if (outcome.status === "malformed") throw new AppError("bad_input", outcome.issues.map((i) => (i.path ? `${i.path}: ${i.message}` : i.message)).join("; "));
    if (outcome.status !== "holds") throw new AppError("internal", "The check answered a different question.");
    if (!job.ownerId) throw new AppError("conflict", "The job's owner has left; nothing was saved.");
    const stored = await createCertifiedEdge({
      workspaceId: job.workspaceId,
      userId: job.ownerId,
      certificate: { address: outcome.address, kind: outcome.kind, formatVersion: outcome.formatVersion, body: outcome.body, checkerVersion: outcome.checkerVersion, verifiedAt: new Date() },
      source: outcome.source,
      target: outcome.target,
      map: { kind: outcome.kind, block: outcome.block, steps: outcome.steps, summary: outcome.text },
      linkBase: env.APP_URL,
    });
    onProgress(1, "stored the map");
    return { ok: true, ...stored, summary: outcome.text };
  },
});
