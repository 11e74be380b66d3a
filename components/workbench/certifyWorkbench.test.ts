import { describe, expect, it } from "vitest";
import { certificateAddress, certifyProjection } from "@/lib/certificate";
import { describeModel, modelAddress, type Model } from "@/lib/models";
import { certifyWorkbench, type ApiCall } from "./certifyWorkbench";
import { emptyWorkbench, type WbAction, type WbEdge, type WbNode, type Workbench } from "./workbenchState";

const node = (id: string, rule: number | null): WbNode => ({ id, name: "", description: "", model: rule === null ? null : { kind: "eca", rule }, modelId: null, note: "", x: 0, y: 0 });
const edge = (id: string, source: string, target: string, projection: number[]): WbEdge => ({
  id,
  source,
  target,
  spec: { kind: "projection", block: Math.log2(projection.length), projection },
  state: "proposed",
  mapId: null,
  certificateAddress: null,
  problem: null,
});
const parityTwice: Workbench = {
  ...emptyWorkbench,
  nodes: [node("a", 105), node("b", null), node("c", null)],
  edges: [edge("e1", "a", "b", [0, 1, 1, 0]), edge("e2", "b", "c", [0, 1, 1, 0])],
  chain: { name: "twice", id: null, address: null },
};

/**
 * An in-memory stand-in for the app's API, answering as the routes do: models by address, maps built
 * with the core's builder (a failing square is a 422 with its counterexample), chains by map ids.
 * `override` answers some calls differently (a role refusal, a composite too large for a request).
 */
function fakeApi(override: (method: string, path: string) => { status: number; body: unknown } | null = () => null) {
  const calls: string[] = [];
  const models = new Map<string, { id: string; model: Model }>();
  const maps = new Map<string, { target: string; address: string; certificate: unknown }>();
  const store = (model: Model) => {
    const address = modelAddress(model);
    if (!models.has(address)) models.set(address, { id: `m${models.size + 1}`, model });
    return models.get(address)!;
  };
  const byId = (id: string) => [...models.values()].find((m) => m.id === id)!;
  let jobPolls = 0;
  const api: ApiCall = async (method, path, body) => {
    calls.push(`${method} ${path}`);
    const special = override(method, path);
    if (special) return special;
    const b = body as Record<string, never>;
    if (method === "POST" && path === "/api/models") {
      const m = store(b.model as Model);
      return { status: 201, body: { model: { id: m.id, name: describeModel(m.model) } } };
    }
    if (method === "POST" && path === "/api/certificates") {
      const build = b.build as { rule: number; block: number; projection: number[] };
      const built = certifyProjection(build);
      if (!built.ok) return { status: 422, body: { error: { message: "The square does not commute; nothing was written.", details: { counterexample: built.counterexample } } } };
      const target = store(built.certificate.target);
      const mapId = `map${maps.size + 1}`;
      maps.set(mapId, { target: target.id, address: certificateAddress(built.certificate), certificate: built.certificate });
      return { status: 201, body: { mapId, address: certificateAddress(built.certificate) } };
    }
    const map = /^\/api\/maps\/(.+)$/.exec(path);
    if (map) {
      const m = maps.get(map[1])!;
      return { status: 200, body: { target: { id: m.target, name: describeModel(byId(m.target).model) }, certificateAddress: m.address } };
    }
    const model = /^\/api\/models\/(.+)$/.exec(path);
    if (model) return { status: 200, body: { model: byId(model[1]).model } };
    const cert = /^\/api\/certificates\/(.+)$/.exec(path);
    if (cert) return { status: 200, body: { certificate: [...maps.values()].find((m) => m.address === decodeURIComponent(cert[1]))!.certificate } };
    if (method === "POST" && path === "/api/chains") return { status: 201, body: { chainId: "chain1", address: "sha256:c", verification: "links+composite" } };
    if (method === "POST" && path === "/api/jobs") return { status: 201, body: { id: "job1", status: "queued", progress: 0, currentItem: null, result: null, error: null } };
    if (path === "/api/jobs/job1") {
      jobPolls += 1;
      return jobPolls < 2
        ? { status: 200, body: { id: "job1", status: "running", progress: 0.5, currentItem: "checking", result: null, error: null } }
        : { status: 200, body: { id: "job1", status: "succeeded", progress: 1, currentItem: null, result: { chainId: "chain2", composite: "sha256:j", verification: "links+composite" }, error: null } };
    }
    throw new Error(`unexpected call ${method} ${path}`);
  };
  return { api, calls };
}

describe("certifyWorkbench", () => {
  it("stores the drawn model, certifies each map in order, fills in the models they determine, then stores the chain", async () => {
    const { api, calls } = fakeApi();
    const actions: WbAction[] = [];
    const outcome = await certifyWorkbench(parityTwice, api, (a) => actions.push(a));
    expect(outcome).toEqual({ ok: true, message: "Every map and the chain of 2 are certified (links+composite).", chainId: "chain1" });
    expect(calls.filter((c) => c.startsWith("POST"))).toEqual(["POST /api/models", "POST /api/certificates", "POST /api/certificates", "POST /api/chains"]);
    // Rule 105 → 150 → 150 by block-2 parity (Israeli & Goldenfeld, PRE 73, 026203, 2006).
    const filled = actions.flatMap((a) => (a.type === "node-result" && a.patch.model ? [[a.id, a.patch.name]] : []));
    expect(filled).toEqual([
      ["b", "ECA 150"],
      ["c", "ECA 150"],
    ]);
    expect(actions.filter((a) => a.type === "edge-result" && a.patch.state === "certified").map((a) => (a as { id: string }).id)).toEqual(["e1", "e2"]);
  });

  it("marks a map whose square fails as refused with the counterexample, and stores no chain", async () => {
    const { api, calls } = fakeApi();
    const actions: WbAction[] = [];
    const w: Workbench = { ...emptyWorkbench, nodes: [node("a", 110), node("b", null)], edges: [edge("e1", "a", "b", [0, 0, 0, 1])] };
    const outcome = await certifyWorkbench(w, api, (a) => actions.push(a));
    expect(outcome.ok).toBe(false);
    const refused = actions.find((a) => a.type === "edge-result" && a.patch.state === "refused") as Extract<WbAction, { type: "edge-result" }>;
    expect((refused.patch.problem?.counterexample as { kind: string }).kind).toBe("not-a-function");
    expect(calls).not.toContain("POST /api/chains");
  });

  it("stops at the first refusal of the role and puts the map back to proposed", async () => {
    const { api, calls } = fakeApi((method, path) => (path === "/api/certificates" ? { status: 403, body: { error: { message: "no" } } } : null));
    const actions: WbAction[] = [];
    const outcome = await certifyWorkbench(parityTwice, api, (a) => actions.push(a));
    expect(outcome).toEqual({ ok: false, message: "Your role may not certify maps (contributor or higher).", chainId: null });
    expect(calls.filter((c) => c === "POST /api/certificates")).toHaveLength(1);
    expect(actions.at(-1)).toEqual({ type: "edge-result", id: "e1", patch: { state: "proposed" } });
  });

  it("checks a composite too large for a request as a verify-chain job, reporting its progress", async () => {
    const { api, calls } = fakeApi((method, path) => (method === "POST" && path === "/api/chains" ? { status: 413, body: { error: { message: "too large" } } } : null));
    const progress: number[] = [];
    const actions: WbAction[] = [];
    const outcome = await certifyWorkbench(parityTwice, api, (a) => actions.push(a), { jobs: { pollMs: 0, wait: async () => {}, onProgress: (p) => progress.push(p) } });
    expect(outcome.chainId).toBe("chain2");
    expect(calls).toContain("POST /api/jobs");
    expect(progress).toEqual([0, 0.5, 1]);
    expect(actions.at(-1)).toEqual({ type: "chain-result", id: "chain2", address: "sha256:j" });
  });
});
