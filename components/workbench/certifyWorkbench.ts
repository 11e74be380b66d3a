import { canonicalModel, modelRuleTable, type Model } from "@/lib/models";
import { chainPath, type MapSpec, type WbAction, type WbEdge, type WbNode, type Workbench } from "./workbenchState";

/** One JSON call to the app's API: what the page uses (fetch) and what the benchmark uses (fetch with a cookie). */
export type ApiCall = (method: "GET" | "POST" | "PATCH" | "DELETE", path: string, body?: unknown) => Promise<{ status: number; body: unknown }>;

/** Follows a job: waits `pollMs` between looks, and reports progress (0–1) with the job's current item. */
export type JobFollower = { pollMs: number; wait: (ms: number) => Promise<void>; onProgress: (progress: number, item: string | null) => void };

export type CertifyOutcome = { ok: boolean; message: string; chainId: string | null };

type ErrorBody = { error?: { message?: string; field?: string; details?: { counterexample?: unknown; link?: number | null } } };

/** The claim the server builds a certificate from (POST /api/certificates `build`), from the source model and the map. */
export function buildRequest(source: Model, spec: MapSpec): Record<string, unknown> {
  const rule = (): Record<string, unknown> => {
    if (source.kind === "eca") return { rule: source.rule };
    if (source.kind === "ca") return { table: { k: source.k, r: source.r, table: source.table } };
    if (source.kind === "markov" || source.kind === "decimated") throw new Error("a cellular-automaton map needs a cellular automaton as its source");
    const t = modelRuleTable(source);
    return { table: { k: t.k, r: t.r, table: Array.from(t.table) } };
  };
  const chain = () => {
    if (source.kind !== "markov" && source.kind !== "decimated") throw new Error("a Markov-chain map needs a Markov chain as its source");
    return source;
  };
  switch (spec.kind) {
    case "projection":
      return { kind: "projection", ...rule(), block: spec.block, projection: spec.projection };
    case "blocking":
      return { kind: "blocking", ...rule(), block: spec.block };
    case "iterate":
      return { kind: "iterate", ...rule(), steps: spec.steps };
    case "lumping":
      return { kind: "lumping", chain: chain(), partition: spec.partition };
    case "decimation":
      return { kind: "decimation", chain: chain(), steps: spec.steps };
  }
}

function errorOf(body: unknown): NonNullable<ErrorBody["error"]> {
  return (body as ErrorBody)?.error ?? {};
}

/**
 * Certify: stores the models made on the canvas, sends every proposed map to the server (which builds
 * and verifies its certificate and writes it in one transaction, or answers 422 with a counterexample),
 * fills in the models the maps determine, and when the maps form one path of two or more links stores
 * the chain, which the server composes and verifies again. Each answer is dispatched as it comes.
 */
export async function certifyWorkbench(
  start: Workbench,
  api: ApiCall,
  dispatch: (a: WbAction) => void,
  options: { jobs?: JobFollower } = {},
): Promise<CertifyOutcome> {
  const nodes = new Map(start.nodes.map((n) => [n.id, { ...n }]));
  for (const node of nodes.values()) {
    if (!node.model || node.modelId) continue;
    const res = await api("POST", "/api/models", { model: node.model, name: node.name || undefined, description: node.description || undefined });
    if (res.status >= 300) return { ok: false, message: `${node.name || "A model"}: ${errorOf(res.body).message ?? `refused (${res.status})`}`, chainId: null };
    const stored = res.body as { model: { id: string; name: string } };
    node.modelId = stored.model.id;
    dispatch({ type: "node-result", id: node.id, patch: { modelId: node.modelId } });
  }

  const edges = new Map(start.edges.map((e) => [e.id, { ...e }]));
  let refused = 0;
  for (;;) {
    const next = [...edges.values()].find((e) => e.state !== "certified" && e.state !== "refused" && nodes.get(e.source)?.model);
    if (!next) break;
    const result = await certifyEdge(next, nodes, api, dispatch);
    if (result === "forbidden") return { ok: false, message: "Your role may not certify maps (contributor or higher).", chainId: null };
    next.state = result;
    if (result === "refused") refused += 1;
  }
  const stuck = [...edges.values()].filter((e) => e.state === "proposed");
  for (const e of stuck) dispatch({ type: "edge-result", id: e.id, patch: { problem: { message: "Its source model is not known yet: certify the map into it first." } } });
  if (refused > 0 || stuck.length > 0) {
    return { ok: false, message: `${refused + stuck.length} map${refused + stuck.length > 1 ? "s were" : " was"} not certified; see the marked edges.`, chainId: null };
  }

  const path = chainPath({ ...start, edges: [...edges.values()] });
  if (!path.ok || path.edges.length < 2) {
    return { ok: true, message: path.ok ? "The map is certified." : `Every map is certified. No chain stored: ${path.reason}`, chainId: null };
  }
  const mapIds = path.edges.map((e) => edges.get(e.id)!.mapId!);
  const name = start.chain.name.trim() || `${nodes.get(path.edges[0].source)?.name || "chain"} in ${mapIds.length} steps`;
  const res = await api("POST", "/api/chains", { name, mapIds });
  if (res.status === 413 && options.jobs) return composeAsJob(name, path.edges.map((e) => edges.get(e.id)!), api, dispatch, options.jobs);
  if (res.status >= 300) {
    const err = errorOf(res.body);
    return { ok: false, message: `The chain was not stored: ${err.message ?? res.status}`, chainId: null };
  }
  const chain = res.body as { chainId: string; address: string; verification: string };
  dispatch({ type: "chain-result", id: chain.chainId, address: chain.address });
  return { ok: true, message: `Every map and the chain of ${mapIds.length} are certified (${chain.verification}).`, chainId: chain.chainId };
}

async function certifyEdge(
  edge: WbEdge,
  nodes: Map<string, WbNode>,
  api: ApiCall,
  dispatch: (a: WbAction) => void,
): Promise<"certified" | "refused" | "forbidden"> {
  const refuse = (message: string, counterexample?: unknown) => {
    dispatch({ type: "edge-result", id: edge.id, patch: { state: "refused", problem: { message, counterexample } } });
    return "refused" as const;
  };
  const source = nodes.get(edge.source)!;
  const target = nodes.get(edge.target)!;
  if (!edge.spec) return refuse("Choose the kind of map first.");
  let build: Record<string, unknown>;
  try {
    build = buildRequest(canonicalModel(source.model), edge.spec);
  } catch (e) {
    return refuse(e instanceof Error ? e.message : String(e));
  }
  dispatch({ type: "edge-result", id: edge.id, patch: { state: "checking", problem: null } });
  const res = await api("POST", "/api/certificates", { build });
  if (res.status === 403) {
    dispatch({ type: "edge-result", id: edge.id, patch: { state: "proposed" } });
    return "forbidden";
  }
  if (res.status >= 300) {
    const err = errorOf(res.body);
    return refuse(err.message ?? `The server answered ${res.status}.`, err.details?.counterexample);
  }
  const { mapId, address } = res.body as { mapId: string; address: string };
  const map = (await api("GET", `/api/maps/${mapId}`)).body as { target: { id: string; name: string } };
  if (target.modelId && target.modelId !== map.target.id) {
    return refuse(`The check derives ${map.target.name} as the target, but this map is drawn to ${target.name || "another model"}.`, {
      kind: "target-mismatch",
      message: "the target the check derives is not the model drawn",
      expected: map.target.name,
      claimed: target.name,
    });
  }
  const model = (await api("GET", `/api/models/${map.target.id}`)).body as { model: Model };
  target.model = model.model;
  target.modelId = map.target.id;
  dispatch({ type: "node-result", id: target.id, patch: { model: model.model, modelId: map.target.id, ...(target.name ? {} : { name: map.target.name }) } });
  if (!target.name) target.name = map.target.name;
  edge.mapId = mapId;
  edge.certificateAddress = address;
  dispatch({ type: "edge-result", id: edge.id, patch: { state: "certified", mapId, certificateAddress: address, problem: null } });
  return "certified";
}

type JobBody = { id: string; status: string; progress: number; currentItem: string | null; result: unknown; error: string | null };

/**
 * A chain whose composite is too large to check within a request (413) is checked by the verify-chain
 * job, whose bounds are larger; it stores the chain when the composite verifies. Progress is reported
 * as the job reports it.
 */
async function composeAsJob(name: string, links: WbEdge[], api: ApiCall, dispatch: (a: WbAction) => void, jobs: JobFollower): Promise<CertifyOutcome> {
  const certificates: unknown[] = [];
  for (const link of links) {
    const res = await api("GET", `/api/maps/${link.mapId}`);
    const address = (res.body as { certificateAddress: string }).certificateAddress;
    const cert = await api("GET", `/api/certificates/${encodeURIComponent(address)}`);
    certificates.push((cert.body as { certificate: unknown }).certificate);
  }
  const started = await api("POST", "/api/jobs", { kind: "verify-chain", params: { name, certificates, save: true } });
  if (started.status >= 300) return { ok: false, message: `The chain check could not start: ${errorOf(started.body).message ?? started.status}`, chainId: null };
  let job = started.body as JobBody;
  while (job.status === "queued" || job.status === "running") {
    jobs.onProgress(job.progress, job.currentItem);
    await jobs.wait(jobs.pollMs);
    job = (await api("GET", `/api/jobs/${job.id}`)).body as JobBody;
  }
  jobs.onProgress(1, null);
  const result = job.result as { chainId?: string; composite?: string; verification?: string } | null;
  if (job.status !== "succeeded" || !result?.chainId) return { ok: false, message: `The chain was not stored: ${job.error ?? job.status}`, chainId: null };
  dispatch({ type: "chain-result", id: result.chainId, address: result.composite ?? "" });
  return { ok: true, message: `Every map and the chain of ${links.length} are certified (${result.verification}, checked as a job).`, chainId: result.chainId };
}
