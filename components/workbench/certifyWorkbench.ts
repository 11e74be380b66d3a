import { verificationName } from "@/components/atlas/chainVerification";
import type { Model } from "@/lib/models";
import { chainPath, type WbAction, type WbEdge, type Workbench } from "./workbenchState";

export { buildRequest } from "@/lib/workbench";

/** One JSON call to the app's API: what the page uses (fetch) and what the benchmark uses (fetch with a cookie). */
export type ApiCall = (method: "GET" | "POST" | "PATCH" | "DELETE", path: string, body?: unknown) => Promise<{ status: number; body: unknown }>;

/** Follows a job: waits `pollMs` between looks, and reports progress (0–1) with the job's current item. */
export type JobFollower = { pollMs: number; wait: (ms: number) => Promise<void>; onProgress: (progress: number, item: string | null, edgeIds: string[]) => void };

/** `counterexample`: the checker's, when the chain (a link or its composite) does not verify, for the page to draw. */
export type CertifyOutcome = { ok: boolean; message: string; chainId: string | null; counterexample?: unknown };

type ErrorBody = { error?: { message?: string; field?: string; details?: { counterexample?: unknown; link?: number | null } } };

/** The answer of POST /api/chains/workbench (app/api/chains/workbench/schema.ts). */
export type WorkbenchAnswer = {
  models: { key: string; id: string; name: string; model: Model }[];
  maps: {
    key: string;
    status: "certified" | "refused" | "too-large" | "skipped";
    mapId?: string;
    address?: string;
    message?: string;
    counterexample?: unknown;
    build?: unknown;
  }[];
  chain: { status: string; chainId?: string; address?: string; verification?: string; message?: string; counterexample?: unknown } | null;
};

function errorOf(body: unknown): NonNullable<ErrorBody["error"]> {
  return (body as ErrorBody)?.error ?? {};
}

const ACTIVE = new Set<WbEdge["state"]>(["proposed", "checking"]);

/** The request for POST /api/chains/workbench: every node, the maps still to check, and the chain when the maps form one. */
export function workbenchRequest(w: Workbench) {
  const maps = w.edges.filter((e) => ACTIVE.has(e.state) && e.spec);
  const path = chainPath(w);
  const chainable = path.ok && path.edges.length >= 2 && path.edges.every((e) => (e.state === "certified" && e.mapId) || maps.some((m) => m.id === e.id));
  return {
    models: w.nodes.map((n) => ({
      key: n.id,
      ...(n.modelId ? { modelId: n.modelId } : n.model ? { model: n.model } : {}),
      ...(n.name ? { name: n.name } : {}),
      ...(n.description ? { description: n.description } : {}),
    })),
    maps: maps.map((e) => ({ key: e.id, source: e.source, target: e.target, spec: e.spec! })),
    chain:
      chainable && path.ok
        ? { name: chainName(w, path.edges.length), links: path.edges.map((e) => (e.state === "certified" && e.mapId ? { mapId: e.mapId } : { map: e.id })) }
        : null,
  };
}

function chainName(w: Workbench, links: number): string {
  const path = chainPath(w);
  const first = path.ok ? w.nodes.find((n) => n.id === path.edges[0].source) : undefined;
  return w.chain.name.trim() || `${first?.name || "chain"} in ${links} steps`;
}

/**
 * Certify: one request (POST /api/chains/workbench) sends the canvas's new models, its proposed maps and
 * the chain; the server checks each map, composes and re-verifies the chain and writes what holds in one
 * transaction. A map too large for a request is then checked as a `verify-map` job and the rest sent
 * again; a composite too large as a `verify-chain` job. Each answer is dispatched as it comes.
 */
export async function certifyWorkbench(
  start: Workbench,
  api: ApiCall,
  dispatch: (a: WbAction) => void,
  options: { jobs?: JobFollower } = {},
): Promise<CertifyOutcome> {
  let w: Workbench = { ...start, nodes: start.nodes.map((n) => ({ ...n })), edges: start.edges.map((e) => ({ ...e })) };
  const apply = (a: WbAction) => {
    dispatch(a);
    if (a.type === "edge-result") w = { ...w, edges: w.edges.map((e) => (e.id === a.id ? { ...e, ...a.patch } : e)) };
    if (a.type === "node-result") w = { ...w, nodes: w.nodes.map((n) => (n.id === a.id ? { ...n, ...a.patch } : n)) };
  };
  for (const e of w.edges) if (ACTIVE.has(e.state) && !e.spec) apply({ type: "edge-result", id: e.id, patch: { state: "refused", problem: { message: "Choose the kind of map first." } } });

  // Each round certifies what a request can; a map checked as a job lets the next round go further.
  for (let round = 0; round < 8; round++) {
    const request = workbenchRequest(w);
    if (request.maps.length === 0 && !request.chain) break;
    for (const m of request.maps) apply({ type: "edge-result", id: m.key, patch: { state: "checking", problem: null } });
    const res = await api("POST", "/api/chains/workbench", request);
    if (res.status >= 300) {
      for (const m of request.maps) apply({ type: "edge-result", id: m.key, patch: { state: "proposed" } });
      if (res.status === 403) return { ok: false, message: "Your role may not certify maps (contributor or higher).", chainId: null };
      const err = errorOf(res.body);
      return { ok: false, message: `Nothing was certified: ${err.message ?? `the server answered ${res.status}`}${err.field ? ` (${err.field})` : ""}.`, chainId: null };
    }
    const answer = res.body as WorkbenchAnswer;
    applyAnswer(w, answer, apply);
    const large = answer.maps.filter((m) => m.status === "too-large");
    if (large.length > 0 && options.jobs) {
      for (const m of large) {
        const done = await certifyMapAsJob(m, api, apply, options.jobs);
        if (!done) return { ok: false, message: "A map too large for a request was not certified as a job; see the marked edge.", chainId: null };
      }
      continue;
    }
    if (answer.chain?.status === "too-large" && options.jobs) {
      const path = chainPath(w);
      if (path.ok) return composeAsJob(chainName(w, path.edges.length), path.edges, api, apply, options.jobs);
    }
    return outcomeOf(w, answer);
  }
  const path = chainPath(w);
  if (w.edges.every((e) => e.state === "certified")) {
    return { ok: true, message: w.chain.id ? `Every map and the chain are certified.` : path.ok ? "The map is certified." : `Every map is certified. No chain stored: ${path.reason}`, chainId: w.chain.id };
  }
  return { ok: false, message: "Nothing left that a request can certify; see the marked edges.", chainId: null };
}

function applyAnswer(w: Workbench, answer: WorkbenchAnswer, apply: (a: WbAction) => void) {
  for (const m of answer.models) {
    const node = w.nodes.find((n) => n.id === m.key);
    if (!node || node.modelId === m.id) continue;
    apply({ type: "node-result", id: m.key, patch: { model: m.model, modelId: m.id, ...(node.name ? {} : { name: m.name }) } });
  }
  for (const m of answer.maps) {
    if (m.status === "certified") {
      apply({ type: "edge-result", id: m.key, patch: { state: "certified", mapId: m.mapId!, certificateAddress: m.address!, problem: null } });
    } else if (m.status === "refused") {
      apply({ type: "edge-result", id: m.key, patch: { state: "refused", problem: { message: m.message ?? "Refused.", counterexample: m.counterexample } } });
    } else {
      apply({ type: "edge-result", id: m.key, patch: { state: "proposed", problem: { message: m.message ?? "Not checked." } } });
    }
  }
  if (answer.chain?.chainId) apply({ type: "chain-result", id: answer.chain.chainId, address: answer.chain.address ?? "" });
}

function outcomeOf(w: Workbench, answer: WorkbenchAnswer): CertifyOutcome {
  const notDone = answer.maps.filter((m) => m.status !== "certified").length + w.edges.filter((e) => e.state === "refused" && !answer.maps.some((m) => m.key === e.id)).length;
  if (notDone > 0) return { ok: false, message: `${notDone} map${notDone > 1 ? "s were" : " was"} not certified; see the marked edges.`, chainId: null };
  const chain = answer.chain;
  if (chain?.chainId) {
    const links = chainPath(w).ok ? (chainPath(w) as { edges: WbEdge[] }).edges.length : 0;
    return { ok: true, message: `Every map and the chain of ${links} are certified (${verificationName(chain.verification ?? "")}).`, chainId: chain.chainId };
  }
  if (chain) return { ok: false, message: `The chain was not stored: ${chain.message ?? chain.status}`, chainId: null, ...withCounterexample(chain.counterexample) };
  const path = chainPath(w);
  return { ok: true, message: path.ok ? (path.edges.length === 1 ? "The map is certified." : "Every map is certified.") : `Every map is certified. No chain stored: ${path.reason}`, chainId: null };
}

type JobBody = { id: string; status: string; progress: number; currentItem: string | null; result: unknown; error: string | null };

async function followJob(kind: string, params: unknown, api: ApiCall, jobs: JobFollower, edgeIds: string[]): Promise<JobBody | { error: string }> {
  const started = await api("POST", "/api/jobs", { kind, params });
  if (started.status >= 300) return { error: errorOf(started.body).message ?? `the job was not started (${started.status})` };
  let job = started.body as JobBody;
  while (job.status === "queued" || job.status === "running") {
    jobs.onProgress(job.progress, job.currentItem, edgeIds);
    await jobs.wait(jobs.pollMs);
    job = (await api("GET", `/api/jobs/${job.id}`)).body as JobBody;
  }
  jobs.onProgress(1, null, edgeIds);
  return job;
}

/** A map whose check exceeds a request's bounds: checked by the verify-map job (larger bounds), progress on its edge. */
async function certifyMapAsJob(m: WorkbenchAnswer["maps"][number], api: ApiCall, apply: (a: WbAction) => void, jobs: JobFollower): Promise<boolean> {
  apply({ type: "edge-result", id: m.key, patch: { state: "checking", problem: { message: `${m.message ?? "Too large for a request"} Checking it as a job.` } } });
  const job = await followJob("verify-map", { build: m.build }, api, jobs, [m.key]);
  const result = "status" in job && job.status === "succeeded" ? (job.result as { mapId?: string; address?: string; counterexample?: unknown; message?: string }) : null;
  if (result?.mapId) {
    apply({ type: "edge-result", id: m.key, patch: { state: "certified", mapId: result.mapId, certificateAddress: result.address ?? null, problem: null } });
    return true;
  }
  const message = result?.message ?? ("error" in job && job.error ? job.error : `The job ${"status" in job ? job.status : "failed"}.`);
  apply({ type: "edge-result", id: m.key, patch: { state: "refused", problem: { message, counterexample: result?.counterexample } } });
  return false;
}

/**
 * A chain whose composite is too large to check within a request is checked by the verify-chain
 * job, whose bounds are larger; it stores the chain when the composite verifies.
 */
async function composeAsJob(name: string, links: WbEdge[], api: ApiCall, apply: (a: WbAction) => void, jobs: JobFollower): Promise<CertifyOutcome> {
  const certificates: unknown[] = [];
  for (const link of links) {
    const address = link.certificateAddress ?? ((await api("GET", `/api/maps/${link.mapId}`)).body as { certificateAddress: string }).certificateAddress;
    const cert = await api("GET", `/api/certificates/${encodeURIComponent(address)}`);
    certificates.push((cert.body as { certificate: unknown }).certificate);
  }
  const job = await followJob("verify-chain", { name, certificates, save: true }, api, jobs, links.map((l) => l.id));
  if ("error" in job && !("status" in job)) return { ok: false, message: `The chain check could not start: ${job.error}`, chainId: null };
  const done = job as JobBody;
  const result = done.result as { chainId?: string; composite?: string; verification?: string; counterexample?: unknown } | null;
  if (done.status !== "succeeded" || !result?.chainId) return { ok: false, message: `The chain was not stored: ${done.error ?? done.status}`, chainId: null, ...withCounterexample(result?.counterexample) };
  apply({ type: "chain-result", id: result.chainId, address: result.composite ?? "" });
  return { ok: true, message: `Every map and the chain of ${links.length} are certified (${verificationName(result.verification ?? "")}, checked as a job).`, chainId: result.chainId };
}

/** A failed chain check's counterexample (the workbench answer's or the verify-chain job's), when there is one. */
function withCounterexample(counterexample: unknown): { counterexample?: unknown } {
  return counterexample ? { counterexample } : {};
}
