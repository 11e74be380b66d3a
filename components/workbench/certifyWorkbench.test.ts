import { describe, expect, it } from "vitest";
import { certificateAddress, certifyProjection } from "@/lib/certificate";
import { describeModel, type Model } from "@/lib/models";
import { certifyWorkbench, workbenchRequest, type ApiCall } from "./certifyWorkbench";
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

type Request = ReturnType<typeof workbenchRequest>;

/**
 * An in-memory stand-in for POST /api/chains/workbench: each map built by the core's builder from its
 * source node (a failing square refused with its counterexample), the chain stored when every link
 * holds. `tooLarge` names maps answered as too large for a request; `override` answers some calls
 * differently (a role refusal, a composite too large for a request).
 */
function fakeApi({ tooLarge = new Set<string>(), override = () => null }: { tooLarge?: Set<string>; override?: (method: string, path: string) => { status: number; body: unknown } | null } = {}) {
  const calls: string[] = [];
  const requests: Request[] = [];
  let jobPolls = 0;
  let maps = 0;
  const api: ApiCall = async (method, path, body) => {
    calls.push(`${method} ${path}`);
    const special = override(method, path);
    if (special) return special;
    if (method === "POST" && path === "/api/chains/workbench") {
      const req = body as Request;
      requests.push(req);
      const known = new Map<string, Model>();
      for (const m of req.models) if ("model" in m && m.model) known.set(m.key, m.model as Model);
      // Stored models in these tests are ECAs with ids "m<rule>".
      for (const m of req.models) if ("modelId" in m && m.modelId) known.set(m.key, { kind: "eca", rule: Number(m.modelId.slice(1)) });
      const answers = req.maps.map((m) => {
        if (tooLarge.has(m.key)) return { key: m.key, status: "too-large", message: "Too large.", build: { kind: "projection" } };
        const source = known.get(m.source) as { rule: number };
        const spec = m.spec as { block: number; projection: number[] };
        const built = certifyProjection({ rule: source.rule, block: spec.block, projection: spec.projection });
        if (!built.ok) return { key: m.key, status: "refused", message: "The square does not commute.", counterexample: built.counterexample };
        known.set(m.target, built.certificate.target);
        maps += 1;
        return { key: m.key, status: "certified", mapId: `map${maps}`, address: certificateAddress(built.certificate) };
      });
      const models = [...known].map(([key, model], i) => ({ key, id: `m${i}`, name: describeModel(model), model }));
      const chain = req.chain ? (answers.every((a) => a.status === "certified") ? { status: "created", chainId: "chain1", address: "sha256:c", verification: "links+composite" } : { status: "not-stored", message: "a link is not certified" }) : null;
      return { status: 200, body: { models, maps: answers, chain } };
    }
    if (method === "POST" && path === "/api/jobs") return { status: 201, body: { id: "job1", status: "queued", progress: 0, currentItem: null, result: null, error: null } };
    if (path === "/api/jobs/job1") {
      jobPolls += 1;
      return jobPolls < 2
        ? { status: 200, body: { id: "job1", status: "running", progress: 0.5, currentItem: "checking", result: null, error: null } }
        : { status: 200, body: { id: "job1", status: "succeeded", progress: 1, currentItem: null, result: { mapId: "jobmap", address: "sha256:m", chainId: "chain2", composite: "sha256:j", verification: "links+composite" }, error: null } };
    }
    if (path.startsWith("/api/certificates/")) return { status: 200, body: { certificate: { stand: "in" } } };
    throw new Error(`unexpected call ${method} ${path}`);
  };
  return { api, calls, requests };
}

const noWait = (progress: number[]) => ({ pollMs: 0, wait: async () => {}, onProgress: (p: number) => progress.push(p) });

describe("certifyWorkbench", () => {
  it("sends the canvas in one request and fills in what the server answers: the derived models, the certified maps, the chain", async () => {
    const { api, calls, requests } = fakeApi();
    const actions: WbAction[] = [];
    const outcome = await certifyWorkbench(parityTwice, api, (a) => actions.push(a));
    expect(outcome).toEqual({ ok: true, message: "Every map and the chain of 2 are certified (each link and the composite verified).", chainId: "chain1" });
    expect(calls).toEqual(["POST /api/chains/workbench"]);
    expect(requests[0]).toEqual({
      models: [{ key: "a", model: { kind: "eca", rule: 105 } }, { key: "b" }, { key: "c" }],
      maps: [
        { key: "e1", source: "a", target: "b", spec: { kind: "projection", block: 2, projection: [0, 1, 1, 0] } },
        { key: "e2", source: "b", target: "c", spec: { kind: "projection", block: 2, projection: [0, 1, 1, 0] } },
      ],
      chain: { name: "twice", links: [{ map: "e1" }, { map: "e2" }] },
    });
    // Rule 105 → 150 → 150 by block-2 parity (Israeli & Goldenfeld, PRE 73, 026203, 2006).
    const filled = actions.flatMap((a) => (a.type === "node-result" && a.patch.model && a.id !== "a" ? [[a.id, a.patch.name]] : []));
    expect(filled).toEqual([
      ["b", "ECA 150"],
      ["c", "ECA 150"],
    ]);
    expect(actions.filter((a) => a.type === "edge-result" && a.patch.state === "certified").map((a) => (a as { id: string }).id)).toEqual(["e1", "e2"]);
    expect(actions.at(-1)).toEqual({ type: "chain-result", id: "chain1", address: "sha256:c" });
  });

  it("links a map already certified into the chain by its id and sends only the new one", async () => {
    const { requests, api } = fakeApi();
    const w: Workbench = {
      ...parityTwice,
      nodes: [{ ...node("a", 105), modelId: "m105" }, { ...node("b", 150), modelId: "m150" }, node("c", null)],
      edges: [{ ...edge("e1", "a", "b", [0, 1, 1, 0]), state: "certified", mapId: "old" }, edge("e2", "b", "c", [0, 1, 1, 0])],
    };
    await certifyWorkbench(w, api, () => {});
    expect(requests[0].models.slice(0, 2)).toEqual([{ key: "a", modelId: "m105" }, { key: "b", modelId: "m150" }]);
    expect(requests[0].maps.map((m) => m.key)).toEqual(["e2"]);
    expect(requests[0].chain?.links).toEqual([{ mapId: "old" }, { map: "e2" }]);
  });

  it("marks a map whose square fails as refused with the counterexample, and reports that nothing was chained", async () => {
    const { api } = fakeApi();
    const actions: WbAction[] = [];
    const w: Workbench = { ...emptyWorkbench, nodes: [node("a", 110), node("b", null)], edges: [edge("e1", "a", "b", [0, 0, 0, 1])] };
    const outcome = await certifyWorkbench(w, api, (a) => actions.push(a));
    expect(outcome).toEqual({ ok: false, message: "1 map was not certified; see the marked edges.", chainId: null });
    const refused = actions.find((a) => a.type === "edge-result" && a.patch.state === "refused") as Extract<WbAction, { type: "edge-result" }>;
    expect((refused.patch.problem?.counterexample as { kind: string }).kind).toBe("not-a-function");
  });

  it("hands on the counterexample of a chain the server refused, for the page to draw", async () => {
    // A failing square found by the core's builder (rule 110, block 2, "all ones"), standing in for what the chain check returns.
    const built = certifyProjection({ rule: 110, block: 2, projection: [0, 0, 0, 1] });
    if (built.ok) throw new Error("expected the all-ones projection of rule 110 to fail");
    const answer = {
      models: [],
      maps: [
        { key: "e1", status: "certified", mapId: "map1", address: "sha256:a" },
        { key: "e2", status: "certified", mapId: "map2", address: "sha256:b" },
      ],
      chain: { status: "refused", message: "link 2 does not verify: the square does not commute", link: 1, counterexample: built.counterexample },
    };
    const { api } = fakeApi({ override: (_m, path) => (path === "/api/chains/workbench" ? { status: 200, body: answer } : null) });
    const outcome = await certifyWorkbench(parityTwice, api, () => {});
    expect(outcome).toEqual({
      ok: false,
      message: "The chain was not stored: link 2 does not verify: the square does not commute",
      chainId: null,
      counterexample: built.counterexample,
    });
  });

  it("puts the maps back to proposed when the role is refused", async () => {
    const { api } = fakeApi({ override: (_m, path) => (path === "/api/chains/workbench" ? { status: 403, body: { error: { message: "no" } } } : null) });
    const actions: WbAction[] = [];
    const outcome = await certifyWorkbench(parityTwice, api, (a) => actions.push(a));
    expect(outcome).toEqual({ ok: false, message: "Your role may not certify maps (contributor or higher).", chainId: null });
    expect(actions.slice(-2)).toEqual([
      { type: "edge-result", id: "e1", patch: { state: "proposed" } },
      { type: "edge-result", id: "e2", patch: { state: "proposed" } },
    ]);
  });

  it("checks a map too large for a request as a verify-map job with its progress, then sends the rest again", async () => {
    const { api, calls } = fakeApi({ tooLarge: new Set(["e1"]) });
    const progress: number[] = [];
    const actions: WbAction[] = [];
    const w: Workbench = { ...emptyWorkbench, nodes: [node("a", 105), node("b", null)], edges: [edge("e1", "a", "b", [0, 1, 1, 0])] };
    const outcome = await certifyWorkbench(w, api, (a) => actions.push(a), { jobs: noWait(progress) });
    expect(calls).toEqual(["POST /api/chains/workbench", "POST /api/jobs", "GET /api/jobs/job1", "GET /api/jobs/job1"]);
    expect(progress).toEqual([0, 0.5, 1]);
    expect(actions.at(-1)).toEqual({ type: "edge-result", id: "e1", patch: { state: "certified", mapId: "jobmap", certificateAddress: "sha256:m", problem: null } });
    expect(outcome.ok).toBe(true);
  });

  it("checks a composite too large for a request as a verify-chain job, reporting its progress", async () => {
    const { api, calls } = fakeApi({
      override: (method, path) =>
        method === "POST" && path === "/api/chains/workbench" && calls.length === 1
          ? {
              status: 200,
              body: {
                models: [],
                maps: [
                  { key: "e1", status: "certified", mapId: "x1", address: "sha256:1" },
                  { key: "e2", status: "certified", mapId: "x2", address: "sha256:2" },
                ],
                chain: { status: "too-large", message: "too large" },
              },
            }
          : null,
    });
    const progress: number[] = [];
    const actions: WbAction[] = [];
    const outcome = await certifyWorkbench(parityTwice, api, (a) => actions.push(a), { jobs: noWait(progress) });
    expect(outcome.chainId).toBe("chain2");
    expect(calls).toContain("POST /api/jobs");
    expect(progress).toEqual([0, 0.5, 1]);
    expect(actions.at(-1)).toEqual({ type: "chain-result", id: "chain2", address: "sha256:j" });
  });
});
