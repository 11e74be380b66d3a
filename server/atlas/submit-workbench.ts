import "server-only";
import { getCertificate, getMap, getModel } from "@/db/queries/atlas";
import { storeWorkbench, type WorkbenchEdgeWrite, type WorkbenchModelWrite } from "@/db/queries/workbench";
import type { ModelFields } from "@/db/queries/models";
import { env } from "@/env";
import type { Model as CanonicalModel } from "@/lib/models";
import { buildRequest, type MapSpec } from "@/lib/workbench";
import { AppError, isAppError } from "@/server/errors";
import type { Owner } from "./fair-queue";
import { runVerification, VERIFY_LIMITS } from "./pool";
import { admit } from "./submit";
import type { BuildRequest, Verified, VerifyOutcome } from "./verify-task";

export type WorkbenchRequest = {
  models: { key: string; modelId?: string; model?: unknown; name?: string; description?: string }[];
  maps: { key: string; source: string; target: string; spec: MapSpec }[];
  chain?: { name: string; links: ({ map: string } | { mapId: string })[] } | null;
};

type Known = { address: string; model: CanonicalModel; id?: string; name: string };

export type MapOutcome =
  | { key: string; status: "certified"; created: boolean; mapId: string; address: string }
  | { key: string; status: "refused"; message: string; field?: string; counterexample?: unknown }
  /** Over the bounds of a request: `build` is the claim, for a job (verify-map) to check instead. */
  | { key: string; status: "too-large"; message: string; bound: string; limit: number; asked: number; build: BuildRequest }
  | { key: string; status: "skipped"; message: string };

export type ChainOutcome =
  | { status: "created" | "existing"; chainId: string; address: string; verification: "links" | "links+composite" }
  | { status: "too-large" | "refused" | "not-stored"; message: string; link?: number | null; counterexample?: unknown };

export type WorkbenchResult = {
  models: { key: string; id: string; name: string; model: CanonicalModel }[];
  maps: MapOutcome[];
  chain: ChainOutcome | null;
};

/**
 * Certifies a workbench in one request: checks every new model and every proposed map in the verifier
 * (in the order the maps determine their targets: a map's target is the next map's source), composes
 * and re-verifies the chain, then writes everything that holds in one transaction. A map that fails
 * comes back refused with its counterexample, one too large for a request comes back with its claim
 * (for a job), and the maps after it are skipped; the chain is stored only when every link holds.
 */
export async function submitWorkbench({
  workspaceId,
  userId,
  request,
  timing = {},
}: {
  workspaceId: string;
  userId: string;
  request: WorkbenchRequest;
  /** Filled with the milliseconds each phase took (models, maps, chain, store), for a Server-Timing header. */
  timing?: Record<string, number>;
}): Promise<WorkbenchResult> {
  const owner: Owner = { workspaceId, userId };
  const known = new Map<string, Known>();
  let t = performance.now();
  const lap = (phase: string) => {
    const now = performance.now();
    timing[phase] = now - t;
    t = now;
  };
  const modelWrites = await checkModels(request, owner, known);
  lap("models");
  const outcomes = new Map<string, MapOutcome>();
  const verified = new Map<string, Verified>();
  const edgeWrites: WorkbenchEdgeWrite[] = [];
  const nodeName = new Map(request.models.map((m) => [m.key, m.name]));

  for (let progress = true; progress; ) {
    progress = false;
    for (const [i, map] of request.maps.entries()) {
      const source = known.get(map.source);
      if (outcomes.has(map.key) || verified.has(map.key) || !source) continue;
      progress = true;
      const outcome = await checkMap(map, i, source, known.get(map.target), owner);
      if ("verified" in outcome) {
        verified.set(map.key, outcome.verified);
        known.set(map.target, { address: outcome.verified.target.address, model: JSON.parse(outcome.verified.target.canonical), name: outcome.verified.target.name });
        edgeWrites.push({ key: map.key, edge: edgeOf(outcome.verified), targetName: request.models.some((m) => m.key === map.target && m.model === undefined && !m.modelId) ? nodeName.get(map.target) : undefined });
      } else outcomes.set(map.key, outcome);
    }
  }
  for (const map of request.maps) {
    if (!outcomes.has(map.key) && !verified.has(map.key)) {
      outcomes.set(map.key, { key: map.key, status: "skipped", message: "Its source model is not known yet: the map into it must be certified first." });
    }
  }

  lap("maps");
  const chainCheck = request.chain ? await checkChain(request.chain, verified, outcomes, owner) : null;
  lap("chain");
  const written = await storeWorkbench({
    workspaceId,
    userId,
    models: modelWrites,
    edges: edgeWrites,
    chain: chainCheck && "composite" in chainCheck ? { name: request.chain!.name, links: chainCheck.links, composite: chainCheck.composite, verification: chainCheck.verification } : null,
  });

  lap("store");
  const models: WorkbenchResult["models"] = [];
  for (const [key, k] of known) {
    const into = request.maps.find((m) => m.target === key && written.edges[m.key]);
    const row = written.models[key] ?? (into ? written.edges[into.key].target : undefined);
    const id = row?.id ?? k.id;
    if (id) models.push({ key, id, name: row?.name ?? k.name, model: k.model });
  }
  const maps = request.maps.map((m): MapOutcome => {
    const e = written.edges[m.key];
    return e ? { key: m.key, status: "certified", created: e.status === "created", mapId: e.mapId, address: e.address } : outcomes.get(m.key)!;
  });
  const chain: ChainOutcome | null = !chainCheck
    ? null
    : "composite" in chainCheck
      ? { ...written.chain!, verification: chainCheck.verification }
      : chainCheck;
  return { models, maps, chain };
}

/** New models are checked (canonical form, sizes) in the verifier; stored ones are read. */
async function checkModels(request: WorkbenchRequest, owner: Owner, known: Map<string, Known>): Promise<WorkbenchModelWrite[]> {
  const writes: WorkbenchModelWrite[] = [];
  const checks = request.models.map(async (m, i) => {
    if (m.modelId) {
      const row = await getModel({ workspaceId: owner.workspaceId, idOrAddress: m.modelId });
      if (!row) throw new AppError("not_found", `No model ${m.modelId} in this workspace.`, { field: `models.${i}.modelId` });
      known.set(m.key, { address: row.address, model: JSON.parse(row.canonical), id: row.id, name: row.name });
      return;
    }
    if (m.model === undefined) return;
    const field = `models.${i}.model`;
    const outcome = await runVerification({ op: "model", model: m.model }, VERIFY_LIMITS, admit(m.model, field, owner));
    const fields = modelFieldsOf(outcome, field);
    known.set(m.key, { address: fields.address, model: JSON.parse(fields.canonical), name: m.name || fields.name });
    writes.push({ key: m.key, fields, genericName: fields.name, name: m.name, description: m.description });
  });
  await Promise.all(checks);
  return writes;
}

function modelFieldsOf(outcome: VerifyOutcome, field: string): ModelFields {
  if (outcome.status === "model") return outcome.fields;
  if (outcome.status === "malformed") {
    const first = outcome.issues[0] ?? { path: "", message: "malformed" };
    const at = first.path ? `${field}.${first.path}` : field;
    throw new AppError("bad_input", `${at}: ${first.message}`, { field: at, details: { issues: outcome.issues } });
  }
  if (outcome.status === "too-large") {
    throw new AppError("too_large", `The model exceeds the limit on ${outcome.bound}: ${outcome.asked} > ${outcome.limit}.`, {
      field,
      details: { bound: outcome.bound, limit: outcome.limit, asked: outcome.asked },
    });
  }
  throw new AppError("internal", "The verification worker answered a different question.");
}

async function checkMap(
  map: WorkbenchRequest["maps"][number],
  i: number,
  source: Known,
  target: Known | undefined,
  owner: Owner,
): Promise<MapOutcome | { verified: Verified }> {
  const field = `maps.${i}.spec`;
  const refused = (message: string, counterexample?: unknown, at = field): MapOutcome => ({ key: map.key, status: "refused", message, field: at, counterexample });
  let build: BuildRequest;
  try {
    build = buildRequest(source.model, map.spec) as BuildRequest;
  } catch (e) {
    return refused(e instanceof Error ? e.message : String(e));
  }
  let outcome: VerifyOutcome;
  try {
    outcome = await runVerification({ op: "build", build }, VERIFY_LIMITS, admit(build, field, owner));
  } catch (e) {
    if (isAppError(e) && e.code === "too_large") return tooLarge(map.key, e.message, e.details, build);
    throw e;
  }
  switch (outcome.status) {
    case "holds":
      if (target && target.address !== outcome.target.address) {
        return refused(`The check derives ${outcome.target.name} as the target, but this map is drawn to ${target.name}.`, {
          kind: "target-mismatch",
          message: "the target the check derives is not the model drawn",
          expected: outcome.target.name,
          claimed: target.name,
        });
      }
      return { verified: outcome };
    case "fails":
      return refused("The square does not commute; nothing was written for this map.", outcome.counterexample);
    case "malformed": {
      const first = outcome.issues[0] ?? { path: "", message: "malformed" };
      return refused(first.path ? `${first.path}: ${first.message}` : first.message, undefined, first.path ? `${field}.${first.path}` : field);
    }
    case "too-large":
      return tooLarge(map.key, `The check exceeds the limit on ${outcome.bound}: ${outcome.asked} > ${outcome.limit}.`, outcome, build);
    default:
      throw new AppError("internal", "The verification worker answered a different question.");
  }
}

function tooLarge(key: string, message: string, details: unknown, build: BuildRequest): MapOutcome {
  const d = (details ?? {}) as { bound?: string; limit?: number; asked?: number };
  return { key, status: "too-large", message, bound: d.bound ?? "size", limit: d.limit ?? 0, asked: d.asked ?? 0, build };
}

function edgeOf(v: Verified): WorkbenchEdgeWrite["edge"] {
  return {
    certificate: { address: v.address, kind: v.kind, formatVersion: v.formatVersion, body: v.body, checkerVersion: v.checkerVersion, verifiedAt: new Date() },
    source: v.source,
    target: v.target,
    map: { kind: v.kind, block: v.block, steps: v.steps, summary: v.text },
    linkBase: env.APP_URL,
  };
}

/** The chain's links as certificates (new ones verified just now, stored ones read), composed and re-verified. */
async function checkChain(
  chain: NonNullable<WorkbenchRequest["chain"]>,
  verified: Map<string, Verified>,
  outcomes: Map<string, MapOutcome>,
  owner: Owner,
): Promise<
  | { links: ({ key: string } | { mapId: string })[]; composite: NonNullable<Parameters<typeof storeWorkbench>[0]["chain"]>["composite"]; verification: "links" | "links+composite" }
  | Extract<ChainOutcome, { message: string }>
> {
  const certificates: unknown[] = [];
  const links: ({ key: string } | { mapId: string })[] = [];
  for (const [i, link] of chain.links.entries()) {
    if ("map" in link) {
      const v = verified.get(link.map);
      if (!v) return { status: "not-stored", message: `Link ${i + 1} is not certified (${outcomes.get(link.map)?.status ?? "not in this request"}), so the chain was not stored.`, link: i };
      certificates.push(JSON.parse(v.body));
      links.push({ key: link.map });
      continue;
    }
    const map = await getMap({ workspaceId: owner.workspaceId, mapId: link.mapId });
    if (!map) throw new AppError("not_found", `No map ${link.mapId} in this workspace.`, { field: `chain.links.${i}.mapId` });
    if (map.status !== "certified") return { status: "not-stored", message: `Link ${i + 1} was retracted: ${map.retractedReason ?? "no reason given"}.`, link: i };
    const cert = await getCertificate({ address: map.certificateAddress });
    if (!cert) throw new AppError("internal", `The certificate of map ${link.mapId} is missing.`);
    certificates.push(JSON.parse(cert.body));
    links.push({ mapId: link.mapId });
  }
  let outcome: VerifyOutcome;
  try {
    outcome = await runVerification({ op: "chain", certificates }, VERIFY_LIMITS, owner);
  } catch (e) {
    if (isAppError(e) && e.code === "too_large") return { status: "too-large", message: e.message };
    throw e;
  }
  if (outcome.status === "broken-chain") return { status: "refused", message: outcome.reason, link: outcome.link >= 0 ? outcome.link : null, counterexample: outcome.counterexample };
  if (outcome.status !== "chain") throw new AppError("internal", "The verification worker answered a different question.");
  const c = outcome.composite;
  return {
    links,
    composite: { address: c.address, kind: c.kind, formatVersion: c.formatVersion, body: c.body, checkerVersion: c.checkerVersion, verifiedAt: new Date() },
    verification: outcome.verification,
  };
}
