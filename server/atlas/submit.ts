import "server-only";
import { createCertifiedEdge, createChain, getCertificate, getMap, upsertModel } from "@/db/queries/atlas";
import { findMapIdByCertificate, type CertifiedEdgeInput } from "@/db/queries/maps";
import type { Model } from "@/db/schema";
import { env } from "@/env";
import { AppError } from "@/server/errors";
import { requireHolds } from "./outcome";
import type { Owner } from "./fair-queue";
import { exceededServerBound, isSmall, payloadSize } from "./payload-size";
import { runVerification, VERIFY_LIMITS, type CheckOwner } from "./pool";
import type { BuildRequest, Derivation, Verified } from "./verify-task";

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
  const owner = admit(certificate, "certificate", { workspaceId, userId });
  const known = await existingFor(workspaceId, certificate, owner);
  if (known) return known;
  const verified = requireHolds(await runVerification({ op: "verify", certificate }, VERIFY_LIMITS, owner), "certificate");
  return store({ workspaceId, userId, verified });
}

/** Builds the certificate on the server from a claim (a script without the core), then as above. */
export async function submitBuild({
  workspaceId,
  userId,
  build,
  onStep,
}: {
  workspaceId: string;
  userId: string;
  build: BuildRequest;
  /** Called after each step of the write, inside its transaction (fault-injection tests only). */
  onStep?: CertifiedEdgeInput["onStep"];
}): Promise<SubmitResult> {
  const owner = admit(build, "build", { workspaceId, userId });
  const verified = requireHolds(await runVerification({ op: "build", build }, VERIFY_LIMITS, owner), "build");
  return store({ workspaceId, userId, verified, onStep });
}

/** Stores a model once (canonical form, content address); the same model again is the same row. */
export async function ensureModel({
  workspaceId,
  userId,
  model,
  naming = {},
}: {
  workspaceId: string;
  userId: string;
  model: unknown;
  /** The maker's name and description, used when the model is stored now. */
  naming?: { name?: string; description?: string };
}): Promise<{ status: "created" | "existing"; model: Model }> {
  const owner = admit(model, "model", { workspaceId, userId });
  const outcome = await runVerification({ op: "model", model }, VERIFY_LIMITS, owner);
  if (outcome.status === "too-large") requireHolds(outcome, "model");
  if (outcome.status === "malformed") requireHolds(outcome, "model");
  if (outcome.status !== "model") throw new AppError("internal", "The verification worker answered a different question.");
  const fields = { ...outcome.fields, name: naming.name || outcome.fields.name, description: naming.description ?? outcome.fields.description };
  const stored = await upsertModel({ workspaceId, model: fields, userId });
  return { status: stored.created ? "created" : "existing", model: stored.model };
}

/**
 * The request thread's only look at submitted data: sizes (lengths and digit counts, no arithmetic)
 * against the server bounds, answered 413 naming the bound; and whether the check is small enough
 * for the verifier's fast lane. Everything that computes on the data runs in a worker thread.
 */
export function admit(payload: unknown, field: string, owner: Owner): CheckOwner {
  const size = payloadSize(payload);
  const refusal = exceededServerBound(size, VERIFY_LIMITS.sizes, field);
  if (refusal?.status === 400) {
    throw new AppError("bad_input", `${refusal.field}: nests deeper than ${refusal.limit} levels (${refusal.bound}).`, { field: refusal.field });
  }
  if (refusal) {
    throw new AppError("too_large", `The check exceeds the limit on ${refusal.bound}: ${refusal.asked} > ${refusal.limit}.`, {
      field: refusal.field,
      details: { bound: refusal.bound, limit: refusal.limit, asked: refusal.asked },
    });
  }
  return { ...owner, small: isSmall(size) };
}

/**
 * A certificate whose address is already a map here needs no second check: nothing is written. The
 * address (canonical form, rationals in lowest terms) is computed in a worker, never on this thread.
 */
async function existingFor(workspaceId: string, certificate: unknown, owner: CheckOwner): Promise<SubmitResult | null> {
  const outcome = await runVerification({ op: "address", certificate }, VERIFY_LIMITS, owner);
  if (outcome.status !== "address") return null; // malformed: the checker will say where
  const mapId = await findMapIdByCertificate({ workspaceId, address: outcome.address });
  return mapId ? { status: "existing", mapId, address: outcome.address } : null;
}

async function store({
  workspaceId,
  userId,
  verified,
  derivedFromMapId = null,
  derivation = null,
  onStep,
}: {
  workspaceId: string;
  userId: string;
  verified: Verified;
  derivedFromMapId?: string | null;
  derivation?: Derivation | null;
  onStep?: CertifiedEdgeInput["onStep"];
}) {
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
    derivedFromMapId,
    derivation,
    onStep,
  });
}

/**
 * Stores a chain of this workspace's certified maps after the server has verified it: every link's
 * certificate, each link's target equal to the next one's source, and the composite certificate
 * directly when it fits the limits. A broken chain answers 422 naming the link (`mapIds.<i>`).
 */
export async function submitChain({
  workspaceId,
  userId,
  name,
  mapIds,
}: {
  workspaceId: string;
  userId: string;
  name: string;
  mapIds: string[];
}): Promise<{ status: "created" | "existing"; chainId: string; address: string; verification: "links" | "links+composite" }> {
  if (mapIds.length === 0) throw new AppError("bad_input", "A chain needs at least one map.", { field: "mapIds" });
  const certificates: unknown[] = [];
  for (const [i, mapId] of mapIds.entries()) {
    const map = await getMap({ workspaceId, mapId });
    if (!map) throw new AppError("not_found", `No map ${mapId} in this workspace.`, { field: `mapIds.${i}`, details: { link: i } });
    if (map.status !== "certified") {
      throw new AppError("conflict", `Link ${i + 1} was retracted: ${map.retractedReason ?? "no reason given"}.`, {
        field: `mapIds.${i}`,
        details: { link: i },
      });
    }
    const cert = await getCertificate({ address: map.certificateAddress });
    if (!cert) throw new AppError("internal", `The certificate of map ${mapId} is missing.`);
    certificates.push(JSON.parse(cert.body));
  }
  const outcome = await runVerification({ op: "chain", certificates }, VERIFY_LIMITS, { workspaceId, userId });
  if (outcome.status === "broken-chain") {
    throw new AppError("does_not_commute", outcome.reason, {
      field: outcome.link >= 0 ? `mapIds.${outcome.link}` : "mapIds",
      details: { link: outcome.link >= 0 ? outcome.link : null, reason: outcome.reason, counterexample: outcome.counterexample },
    });
  }
  if (outcome.status !== "chain") throw new AppError("internal", "The verification worker answered a different question.");
  const { composite, verification } = outcome;
  const stored = await createChain({
    workspaceId,
    userId,
    name,
    mapIds,
    composite: {
      address: composite.address,
      kind: composite.kind,
      formatVersion: composite.formatVersion,
      body: composite.body,
      checkerVersion: composite.checkerVersion,
      verifiedAt: new Date(),
    },
    verification,
  });
  return { ...stored, verification };
}

/**
 * Adds the symmetry images of a certified CA map (reflection, complement, both), each verified by
 * the checker and stored as derived from the original. Images that are the original are skipped.
 */
export async function submitSymmetricImages({
  workspaceId,
  userId,
  mapId,
}: {
  workspaceId: string;
  userId: string;
  mapId: string;
}): Promise<{ created: SubmitResult[]; skipped: { derivation: Derivation; reason: string }[] }> {
  const map = await getMap({ workspaceId, mapId });
  if (!map) throw new AppError("not_found", `No map ${mapId} in this workspace.`, { field: "mapId" });
  const cert = await getCertificate({ address: map.certificateAddress });
  if (!cert) throw new AppError("internal", `The certificate of map ${mapId} is missing.`);
  const outcome = await runVerification({ op: "symmetry", certificate: JSON.parse(cert.body) }, VERIFY_LIMITS, { workspaceId, userId });
  if (outcome.status !== "derived") {
    requireHolds(outcome, "certificate");
    throw new AppError("internal", "The verification worker answered a different question.");
  }
  const created: SubmitResult[] = [];
  for (const v of outcome.variants) {
    created.push(await store({ workspaceId, userId, verified: v.verified, derivedFromMapId: mapId, derivation: v.derivation }));
  }
  return { created, skipped: outcome.skipped };
}
