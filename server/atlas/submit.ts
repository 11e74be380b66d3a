import "server-only";
import { createCertifiedEdge, upsertModel } from "@/db/queries/atlas";
import { findMapIdByCertificate } from "@/db/queries/maps";
import type { Model } from "@/db/schema";
import { env } from "@/env";
import { certificateAddress } from "@/lib/certificate";
import { AppError } from "@/server/errors";
import { requireHolds } from "./outcome";
import { runVerification } from "./pool";
import type { BuildRequest, Verified } from "./verify-task";

export type SubmitResult = { status: "created" | "existing"; mapId: string; address: string };

/**
 * Verifies a certificate on the server (the core's checker in a worker thread, within the configured
 * limits) and only then writes certificate, models, map, audit event and watchers' mail in one
 * transaction. The same certificate twice in a workspace returns the existing map unchanged.
 * Throws AppError: bad_input (malformed, naming the field), too_large, does_not_commute.
 */
export async function submitCertificate({
  workspaceId,
  userId,
  certificate,
}: {
  workspaceId: string;
  userId: string;
  certificate: unknown;
}): Promise<SubmitResult> {
  const known = await existingFor(workspaceId, certificate);
  if (known) return known;
  const verified = requireHolds(await runVerification({ op: "verify", certificate }), "certificate");
  return store({ workspaceId, userId, verified });
}

/** Builds the certificate on the server from a claim (a script without the core), then as above. */
export async function submitBuild({
  workspaceId,
  userId,
  build,
}: {
  workspaceId: string;
  userId: string;
  build: BuildRequest;
}): Promise<SubmitResult> {
  const verified = requireHolds(await runVerification({ op: "build", build }), "build");
  return store({ workspaceId, userId, verified });
}

/** Stores a model once (canonical form, content address); the same model again is the same row. */
export async function ensureModel({
  workspaceId,
  userId,
  model,
}: {
  workspaceId: string;
  userId: string;
  model: unknown;
}): Promise<{ status: "created" | "existing"; model: Model }> {
  const outcome = await runVerification({ op: "model", model });
  if (outcome.status === "malformed") requireHolds(outcome, "model");
  if (outcome.status !== "model") throw new AppError("internal", "The verification worker answered a different question.");
  const stored = await upsertModel({ workspaceId, model: outcome.fields, userId });
  return { status: stored.created ? "created" : "existing", model: stored.model };
}

/** A certificate whose address is already a map here needs no second check: nothing is written. */
async function existingFor(workspaceId: string, certificate: unknown): Promise<SubmitResult | null> {
  let address: string;
  try {
    address = certificateAddress(certificate);
  } catch {
    return null; // malformed: the checker will say where
  }
  const mapId = await findMapIdByCertificate({ workspaceId, address });
  return mapId ? { status: "existing", mapId, address } : null;
}

async function store({ workspaceId, userId, verified }: { workspaceId: string; userId: string; verified: Verified }) {
  return createCertifiedEdge({
    workspaceId,
    userId,
    certificate: {
      address: verified.address,
      kind: verified.kind,
      formatVersion: verified.formatVersion,
      body: verified.body,
      checkerVersion: verified.checkerVersion,
      verifiedAt: new Date(),
    },
    source: verified.source,
    target: verified.target,
    map: { kind: verified.kind, block: verified.block, steps: verified.steps, summary: verified.text },
    linkBase: env.APP_URL,
  });
}
