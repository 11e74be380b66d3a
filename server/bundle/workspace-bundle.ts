import "server-only";
import { type ImportCertificate, type ImportInput, isWorkspaceEmpty, readWorkspaceContents, writeWorkspaceImport } from "@/db/queries/bundle";
import type { ModelFields } from "@/db/queries/models";
import { MAX_WAITING_PER_PERSON, runVerification } from "@/server/atlas/pool";
import { AppError } from "@/server/errors";
import { BUNDLE_FORMAT, BUNDLE_VERSION, type WorkspaceBundle } from "./bundle-schema";

/** The workspace as a bundle (see bundle-schema.ts); stable order, so two exports of the same atlas are equal but for the date. */
export async function exportWorkspaceBundle({ workspaceId, workspaceName, now = new Date() }: { workspaceId: string; workspaceName: string; now?: Date }): Promise<WorkspaceBundle> {
  const c = await readWorkspaceContents({ workspaceId });
  return {
    format: BUNDLE_FORMAT,
    version: BUNDLE_VERSION,
    exportedAt: now.toISOString(),
    workspace: { name: workspaceName },
    models: c.models.map((m) => ({ address: m.address, name: m.name, description: m.description, tags: JSON.parse(m.tags) as string[], model: JSON.parse(m.canonical) as Record<string, unknown> })),
    certificates: c.certificates.map((x) => JSON.parse(x.body) as Record<string, unknown>),
    maps: c.maps.map((m) => ({
      certificate: m.certificateAddress,
      status: m.status,
      retractedReason: m.retractedReason,
      retractedAt: m.retractedAt ? m.retractedAt.toISOString() : null,
      derivation: (m.derivation as "reflect" | "complement" | "reflect-complement" | null) ?? null,
      derivedFrom: m.derivedFromCertificate,
    })),
    chains: c.chains.map((ch) => ({ name: ch.name, composite: ch.compositeCertificateAddress, verification: ch.verification, links: ch.links })),
    searchRecords: c.searchRecords.map((r) => ({
      model: r.modelAddress,
      kind: r.kind,
      maxBlock: r.maxBlock,
      algorithm: r.algorithm,
      algorithmVersion: r.algorithmVersion,
      coverage: JSON.parse(r.coverage) as Record<string, unknown>,
      outcome: JSON.parse(r.outcome) as Record<string, unknown>,
      found: r.found,
    })),
  };
}

/** Re-verifies one certificate of the bundle with the core's checker; any failure names it and stops the import. */
async function verifyOne(certificate: Record<string, unknown>, index: number): Promise<ImportCertificate> {
  const claimed = typeof certificate.address === "string" ? certificate.address : `#${index}`;
  const field = `certificates.${index}`;
  const outcome = await runVerification({ op: "verify", certificate });
  if (outcome.status !== "holds") {
    const why =
      outcome.status === "malformed"
        ? (outcome.issues[0]?.message ?? "malformed")
        : outcome.status === "fails"
          ? "its square does not commute"
          : outcome.status === "too-large"
            ? `it exceeds the limit on ${outcome.bound}`
            : "it could not be checked";
    throw new AppError("does_not_commute", `Certificate ${claimed} (${field}) does not verify: ${why}. Nothing was imported.`, { field, details: { address: claimed } });
  }
  if (typeof certificate.address === "string" && certificate.address !== outcome.address) {
    throw new AppError("does_not_commute", `Certificate ${claimed} (${field}) is sealed with another address than its content's (${outcome.address}). Nothing was imported.`, { field, details: { address: claimed } });
  }
  return {
    address: outcome.address,
    body: outcome.body,
    kind: outcome.kind,
    formatVersion: outcome.formatVersion,
    checkerVersion: outcome.checkerVersion,
    block: outcome.block,
    steps: outcome.steps,
    summary: outcome.text,
    source: outcome.source,
    target: outcome.target,
  };
}

async function modelFieldsOf(model: Record<string, unknown>, claimed: string, index: number): Promise<ModelFields> {
  const field = `models.${index}`;
  const outcome = await runVerification({ op: "model", model });
  if (outcome.status !== "model") throw new AppError("bad_input", `Model ${claimed} (${field}) is not a valid model. Nothing was imported.`, { field });
  if (outcome.fields.address !== claimed) {
    throw new AppError("bad_input", `Model ${claimed} (${field}) has the content address ${outcome.fields.address}. Nothing was imported.`, { field });
  }
  return outcome.fields;
}

/**
 * Runs the checks a batch at a time so that every verification worker thread has work; results in input
 * order, first failure thrown. A batch never exceeds what one caller may have waiting in the fair queue
 * (a larger one was answered 429 by the verifier).
 */
async function inBatches<T, R>(items: T[], f: (item: T, index: number) => Promise<R>, size = MAX_WAITING_PER_PERSON): Promise<R[]> {
  const out: R[] = [];
  for (let start = 0; start < items.length; start += size) {
    out.push(...(await Promise.all(items.slice(start, start + size).map((item, j) => f(item, start + j)))));
  }
  return out;
}

export type CheckedBundle = Omit<ImportInput, "db" | "workspaceId" | "userId">;

/**
 * Checks a bundle without writing anything. Nothing is trusted: every certificate is checked again
 * by the core's checker and every model's address recomputed; every reference must resolve inside
 * the bundle. The first failure is refused naming the certificate (or field).
 */
export async function verifyBundle(bundle: WorkspaceBundle): Promise<CheckedBundle> {
  const verified = new Map<string, ImportCertificate>();
  for (const v of await inBatches(bundle.certificates, (certificate, i) => verifyOne(certificate, i))) verified.set(v.address, v);
  const models = await inBatches(bundle.models, async (m, i) => ({ fields: await modelFieldsOf(m.model, m.address, i), name: m.name, description: m.description, tags: m.tags }));
  const knownModels = new Set(models.map((m) => m.fields.address));
  const need = (address: string, field: string) => {
    if (!verified.has(address)) throw new AppError("bad_input", `${field} refers to the certificate ${address}, which is not among the bundle's certificates.`, { field });
  };
  bundle.maps.forEach((m, i) => {
    need(m.certificate, `maps.${i}.certificate`);
    if (m.derivedFrom) need(m.derivedFrom, `maps.${i}.derivedFrom`);
  });
  const mapped = new Set(bundle.maps.map((m) => m.certificate));
  bundle.chains.forEach((c, i) => {
    need(c.composite, `chains.${i}.composite`);
    c.links.forEach((l, j) => {
      if (!mapped.has(l)) throw new AppError("bad_input", `chains.${i}.links.${j} refers to ${l}, which is not a map of the bundle.`, { field: `chains.${i}.links.${j}` });
    });
  });
  bundle.searchRecords.forEach((r, i) => {
    if (!knownModels.has(r.model)) throw new AppError("bad_input", `searchRecords.${i}.model refers to ${r.model}, which is not a model of the bundle.`, { field: `searchRecords.${i}.model` });
  });
  return {
    models,
    certificates: verified,
    maps: bundle.maps.map((m) => ({
      certificateAddress: m.certificate,
      status: m.status,
      retractedReason: m.retractedReason,
      retractedAt: m.retractedAt ? new Date(m.retractedAt) : null,
      derivation: m.derivation,
      derivedFromCertificate: m.derivedFrom,
    })),
    chains: bundle.chains.map((c) => ({ name: c.name, compositeCertificateAddress: c.composite, verification: c.verification, links: c.links })),
    searchRecords: bundle.searchRecords.map((r) => ({
      modelAddress: r.model,
      kind: r.kind,
      maxBlock: r.maxBlock,
      algorithm: r.algorithm,
      algorithmVersion: r.algorithmVersion,
      coverage: JSON.stringify(r.coverage),
      outcome: JSON.stringify(r.outcome),
      found: r.found,
    })),
  };
}

/** Writes a checked bundle into an empty workspace, all or nothing. */
export async function importWorkspaceBundle({ workspaceId, userId, checked }: { workspaceId: string; userId: string; checked: CheckedBundle }) {
  if (!(await isWorkspaceEmpty({ workspaceId }))) {
    throw new AppError("conflict", "This workspace already holds models; import into an empty or a new workspace.", { field: "into" });
  }
  return writeWorkspaceImport({ workspaceId, userId, ...checked });
}

const xml = (s: string) => s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");

/**
 * The atlas as GraphML (the open XML graph format read by general graph tools): models are nodes
 * keyed by content address, maps directed edges with kind, block size, steps, certificate and status.
 */
export async function exportWorkspaceGraphml({ workspaceId, workspaceName }: { workspaceId: string; workspaceName: string }): Promise<string> {
  const c = await readWorkspaceContents({ workspaceId });
  const keys: [string, "node" | "edge", string, string][] = [
    ["name", "node", "name", "string"],
    ["modelKind", "node", "kind", "string"],
    ["rule", "node", "rule", "int"],
    ["mapKind", "edge", "kind", "string"],
    ["block", "edge", "block", "int"],
    ["steps", "edge", "steps", "int"],
    ["certificate", "edge", "certificate", "string"],
    ["status", "edge", "status", "string"],
  ];
  const lines = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<graphml xmlns="http://graphml.graphdrawing.org/xmlns" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance" xsi:schemaLocation="http://graphml.graphdrawing.org/xmlns http://graphml.graphdrawing.org/xmlns/1.0/graphml.xsd">',
    ...keys.map(([id, on, name, type]) => `  <key id="${id}" for="${on}" attr.name="${name}" attr.type="${type}"/>`),
    `  <graph id="atlas" edgedefault="directed">`,
    `    <desc>${xml(workspaceName)}</desc>`,
  ];
  for (const m of c.models) {
    const model = JSON.parse(m.canonical) as { kind?: string; rule?: number };
    const rule = typeof model.rule === "number" ? `<data key="rule">${model.rule}</data>` : "";
    lines.push(`    <node id="${m.address}"><data key="name">${xml(m.name)}</data><data key="modelKind">${xml(model.kind ?? "")}</data>${rule}</node>`);
  }
  c.maps.forEach((m, i) => {
    const data = [
      `<data key="mapKind">${xml(m.kind)}</data>`,
      m.block !== null ? `<data key="block">${m.block}</data>` : "",
      m.steps !== null ? `<data key="steps">${m.steps}</data>` : "",
      `<data key="certificate">${m.certificateAddress}</data>`,
      `<data key="status">${m.status}</data>`,
    ].join("");
    lines.push(`    <edge id="e${i}" source="${m.sourceAddress}" target="${m.targetAddress}">${data}</edge>`);
  });
  lines.push("  </graph>", "</graphml>");
  return lines.join("\n") + "\n";
}
