/**
 * What the verification worker thread runs. Depends on lib/ alone (no database, no Next), so it
 * loads the same way in a worker under `next start`, vitest and tsx.
 */
import type { ModelFields } from "@/db/queries/models";
import {
  certificateAddress,
  certificateSummary,
  certificateText,
  certifyBlocking,
  certifyDecimation,
  certifyIterate,
  certifyLumping,
  certifyProjection,
  CERTIFICATE_VERSION,
  type Certificate,
  type Counterexample,
} from "@/lib/certificate";
import { composeChain } from "@/lib/chain";
import { canonicalModel, ModelInputError } from "@/lib/models";
import { complementCertificate, reflectCertificate, symmetryClass } from "@/lib/symmetry";
import { buildRequestRefusal, CHECKER_VERSION, verifyCertificate, type Limits, type VerifyResult } from "@/lib/verify";
import { modelFields } from "./model-fields";
import { modelExceeds } from "./model-bounds";
import { exceededServerBound, payloadSize, type SizeRefusal } from "./payload-size";

/** Ask the server to build the certificate from a claim (what a script sends when it has no builder). */
export type BuildRequest =
  | { kind: "projection"; rule?: number; table?: { k: number; r: number; table: number[] }; block: number; steps?: number; projection: number[] | string }
  | { kind: "lumping"; chain: unknown; partition: number[]; steps?: number }
  | { kind: "decimation"; chain: unknown; steps: number }
  | { kind: "blocking"; rule?: number; table?: { k: number; r: number; table: number[] }; block: number; steps?: number }
  | { kind: "iterate"; rule?: number; table?: { k: number; r: number; table: number[] }; steps: number };

export type VerifyTask =
  | { op: "verify"; certificate: unknown; limits: Limits }
  | { op: "build"; build: BuildRequest; limits: Limits }
  | { op: "model"; model: unknown; limits: Limits }
  | { op: "address"; certificate: unknown; limits: Limits }
  | { op: "chain"; certificates: unknown[]; limits: Limits }
  | { op: "symmetry"; certificate: unknown; limits: Limits };

export type Derivation = "reflect" | "complement" | "reflect-complement";

/** A verified certificate, ready to be written: plain data (it crosses a thread boundary). */
export type Verified = {
  status: "holds";
  address: string;
  body: string;
  checkerVersion: string;
  formatVersion: number;
  kind: Certificate["map"]["kind"];
  block: number | null;
  steps: number | null;
  text: string;
  source: ModelFields;
  target: ModelFields;
};

export type VerifyOutcome =
  | Verified
  | Exclude<VerifyResult, { status: "holds" }>
  | { status: "model"; fields: ModelFields }
  | { status: "address"; address: string }
  | { status: "chain"; composite: Verified; verification: "links" | "links+composite" }
  | { status: "broken-chain"; link: number; reason: string; counterexample?: Counterexample }
  | { status: "derived"; variants: { derivation: Derivation; verified: Verified }[]; skipped: { derivation: Derivation; reason: string }[] };

/**
 * Runs one task in the worker thread. The server bounds are checked again here, before any work, so
 * that a task that reached the worker another way is held to the same limits as a request.
 */
export function runVerifyTask(task: VerifyTask): VerifyOutcome {
  const oversized = exceededServerBound(payloadSize(payloadOf(task)), task.limits, "");
  if (oversized) return tooLarge(oversized);
  switch (task.op) {
    case "verify":
      return described(verifyCertificate(task.certificate, task.limits));
    case "build":
      return build(task.build, task.limits);
    case "symmetry":
      return symmetric(task.certificate, task.limits);
    case "chain": {
      const result = composeChain(task.certificates as Certificate[], task.limits);
      if (!result.ok) return { status: "broken-chain", link: result.link, reason: result.reason, counterexample: result.counterexample };
      const composite = verifiedFields(result.composite, "");
      return { status: "chain", composite, verification: result.verification };
    }
    case "address":
      try {
        return { status: "address", address: certificateAddress(task.certificate) };
      } catch (e) {
        return { status: "malformed", issues: [{ path: "", message: e instanceof Error ? e.message : String(e) }] };
      }
    case "model":
      try {
        const model = canonicalModel(task.model);
        const over = modelExceeds(model, task.limits);
        if (over) return { status: "too-large", ...over };
        return { status: "model", fields: modelFields(model, symmetryClass) };
      } catch (e) {
        if (e instanceof ModelInputError) return { status: "malformed", issues: e.issues };
        return { status: "malformed", issues: [{ path: "", message: e instanceof Error ? e.message : String(e) }] };
      }
  }
}

function build(request: BuildRequest, limits: Limits): VerifyOutcome {
  // Every bound of the core (steps, states, digits, predicted cost) before the builder does any work.
  const refusal = buildRequestRefusal(request, limits);
  if (refusal) return refusal;
  let built;
  try {
    built = builders[request.kind](request as never);
  } catch (e) {
    const field = (e as { field?: unknown }).field;
    const issues = (e as { issues?: { path: string; message: string }[] }).issues;
    if (Array.isArray(issues)) return { status: "malformed", issues };
    return {
      status: "malformed",
      issues: [{ path: typeof field === "string" ? field : "", message: e instanceof Error ? e.message : String(e) }],
    };
  }
  if (!built.ok) return { status: "fails", address: "", counterexample: built.counterexample as never };
  // The builder ran the check; the independent checker runs it again, within the limits.
  return described(verifyCertificate(built.certificate, limits));
}

const builders: Record<BuildRequest["kind"], (r: never) => { ok: true; certificate: Certificate } | { ok: false; counterexample: unknown }> = {
  projection: certifyProjection,
  lumping: certifyLumping,
  decimation: certifyDecimation,
  blocking: certifyBlocking,
  iterate: certifyIterate,
};

function described(result: VerifyResult): VerifyOutcome {
  if (result.status !== "holds") return result;
  return verifiedFields(result.certificate, result.checkerVersion);
}

/** The stored form of a verified certificate; `checkerVersion` "" when the caller fills it in. */
function verifiedFields(certificate: Certificate, checkerVersion: string): Verified {
  const summary = certificateSummary(certificate);
  return {
    status: "holds",
    address: certificateAddress(certificate),
    body: certificateText(certificate),
    checkerVersion: checkerVersion || CHECKER_VERSION,
    formatVersion: CERTIFICATE_VERSION,
    kind: summary.kind,
    block: summary.block ?? null,
    steps: summary.steps ?? null,
    text: summary.text,
    source: modelFields(summary.source, symmetryClass),
    target: modelFields(summary.target, symmetryClass),
  };
}

const SYMMETRIES: Record<Derivation, (c: Certificate) => Certificate> = {
  reflect: reflectCertificate,
  complement: complementCertificate,
  "reflect-complement": (c) => reflectCertificate(complementCertificate(c)),
};

/**
 * The reflected and complemented images of a verified CA certificate (DOMAIN.md §4), each checked by
 * the same checker: a derived edge is never assumed. Images equal to the original are skipped.
 */
function symmetric(input: unknown, limits: Limits): VerifyOutcome {
  const original = verifyCertificate(input, limits);
  if (original.status !== "holds") return original;
  const variants: { derivation: Derivation; verified: Verified }[] = [];
  const skipped: { derivation: Derivation; reason: string }[] = [];
  const seen = new Set([original.address]);
  for (const derivation of Object.keys(SYMMETRIES) as Derivation[]) {
    let image: Certificate;
    try {
      image = SYMMETRIES[derivation](original.certificate);
    } catch (e) {
      skipped.push({ derivation, reason: e instanceof Error ? e.message : String(e) });
      continue;
    }
    const checked = verifyCertificate(image, limits);
    if (checked.status !== "holds") {
      skipped.push({ derivation, reason: `the image does not verify (${checked.status})` });
      continue;
    }
    if (seen.has(checked.address)) {
      skipped.push({ derivation, reason: "the image is a certificate already in this set" });
      continue;
    }
    seen.add(checked.address);
    variants.push({ derivation, verified: verifiedFields(checked.certificate, checked.checkerVersion) });
  }
  return { status: "derived", variants, skipped };
}

function payloadOf(task: VerifyTask): unknown {
  switch (task.op) {
    case "verify":
    case "address":
    case "symmetry":
      return task.certificate;
    case "build":
      return task.build;
    case "model":
      return task.model;
    case "chain":
      return null; // stored certificates, each verified within the limits when it was submitted
  }
}

function tooLarge(refusal: SizeRefusal): VerifyOutcome {
  if (refusal.status === 400) return { status: "malformed", issues: [{ path: refusal.field, message: `nests deeper than ${refusal.limit} levels (${refusal.bound})` }] };
  return { status: "too-large", bound: refusal.bound, limit: refusal.limit, asked: refusal.asked };
}
