import { describe, expect, it } from "vitest";
import { derivedModel, nodeLabel } from "./derivedModels";
import { presetProjection, projectionIssue } from "./projectionPresets";
import { edgeText } from "./workbench-canvas";
import { chainPath, edgeRefusal, emptyWorkbench, initialHistory, workbenchReducer, type WbAction, type WbEdge, type WbNode } from "./workbenchState";

const node = (id: string, rule: number | null = null): WbNode => ({
  id,
  name: id,
  description: "",
  model: rule === null ? null : { kind: "eca", rule },
  modelId: null,
  note: "",
  x: 0,
  y: 0,
});
const edge = (id: string, source: string, target: string): WbEdge => ({
  id,
  source,
  target,
  spec: { kind: "projection", block: 2, projection: [0, 1, 1, 0] },
  state: "proposed",
  mapId: null,
  certificateAddress: null,
  problem: null,
});
const run = (actions: WbAction[]) => actions.reduce(workbenchReducer, initialHistory());

describe("workbenchReducer", () => {
  it("undoes and redoes canvas edits in order, and a new edit clears the redo list", () => {
    let h = run([{ type: "add-node", node: node("a", 105) }, { type: "add-node", node: node("b") }, { type: "add-edge", edge: edge("e", "a", "b") }]);
    expect(h.present.edges).toHaveLength(1);
    h = workbenchReducer(h, { type: "undo" });
    expect(h.present.edges).toHaveLength(0);
    h = workbenchReducer(h, { type: "undo" });
    expect(h.present.nodes.map((n) => n.id)).toEqual(["a"]);
    h = workbenchReducer(h, { type: "redo" });
    expect(h.present.nodes.map((n) => n.id)).toEqual(["a", "b"]);
    h = workbenchReducer(h, { type: "add-node", node: node("c") });
    expect(h.future).toEqual([]);
    expect(workbenchReducer(h, { type: "redo" })).toBe(h);
  });

  it("does not let undo take back what the server certified", () => {
    let h = run([{ type: "add-node", node: node("a", 105) }, { type: "add-node", node: node("b") }, { type: "add-edge", edge: edge("e", "a", "b") }]);
    h = workbenchReducer(h, { type: "edge-result", id: "e", patch: { state: "certified", mapId: "m1" } });
    expect(h.past).toHaveLength(3);
    expect(h.present.edges[0]).toMatchObject({ state: "certified", mapId: "m1" });
  });

  it("sends the maps of a node whose model changed back to proposed", () => {
    let h = run([{ type: "add-node", node: node("a", 105) }, { type: "add-node", node: node("b") }, { type: "add-edge", edge: edge("e", "a", "b") }]);
    h = workbenchReducer(h, { type: "edge-result", id: "e", patch: { state: "certified", mapId: "m1", certificateAddress: "sha256:x" } });
    h = workbenchReducer(h, { type: "update-node", id: "a", patch: { model: { kind: "eca", rule: 150 } } });
    expect(h.present.edges[0]).toMatchObject({ state: "proposed", mapId: null, certificateAddress: null });
  });

  it("drops an atlas map's text when its parameters are changed, so the edge no longer claims to be that map", () => {
    const atlas: WbEdge = { ...edge("e", "a", "b"), spec: { kind: "decimation", steps: 2 }, state: "certified", mapId: "m1", atlasText: "decimation k=2, 4 states" };
    let h = run([{ type: "add-node", node: node("a") }, { type: "add-node", node: node("b") }, { type: "add-edge", edge: atlas }]);
    expect(edgeText(h.present.edges[0])).toBe("decimation k=2, 4 states");
    h = workbenchReducer(h, { type: "set-spec", id: "e", spec: { kind: "decimation", steps: 3 } });
    expect(h.present.edges[0]).not.toHaveProperty("atlasText");
    expect(edgeText(h.present.edges[0])).toBe("decimation k=3");
  });

  it("removing a node removes its maps; edits of unknown ids change nothing", () => {
    let h = run([{ type: "add-node", node: node("a", 105) }, { type: "add-node", node: node("b") }, { type: "add-edge", edge: edge("e", "a", "b") }]);
    expect(workbenchReducer(h, { type: "remove-edge", id: "nope" })).toBe(h);
    h = workbenchReducer(h, { type: "remove-node", id: "b" });
    expect(h.present.edges).toEqual([]);
  });

  it("does not mutate the state it is given", () => {
    const h = run([{ type: "add-node", node: node("a", 105) }, { type: "add-node", node: node("b") }]);
    const before = structuredClone(h);
    workbenchReducer(h, { type: "add-edge", edge: edge("e", "a", "b") });
    workbenchReducer(h, { type: "positions", positions: { a: { x: 5, y: 6 } } });
    expect(h).toEqual(before);
  });

  it("refuses loops, a second map between the same nodes and a second map into a node", () => {
    const w = run([{ type: "add-node", node: node("a", 105) }, { type: "add-node", node: node("b") }, { type: "add-node", node: node("c", 1) }, { type: "add-edge", edge: edge("e", "a", "b") }]).present;
    expect(edgeRefusal(w, "a", "a")).toBe("A map needs two different nodes.");
    expect(edgeRefusal(w, "a", "b")).toBe("These two nodes are already joined by a map.");
    expect(edgeRefusal(w, "c", "b")).toBe("That node already has a map into it; its model is determined by that map.");
    expect(edgeRefusal(w, "b", "c")).toBeNull();
  });
});

describe("chainPath", () => {
  it("orders the maps of one path from its start, however they were drawn", () => {
    const w = { ...emptyWorkbench, nodes: ["a", "b", "c"].map((id) => node(id)), edges: [edge("2", "b", "c"), edge("1", "a", "b")] };
    const path = chainPath(w);
    expect(path.ok && path.edges.map((e) => e.id)).toEqual(["1", "2"]);
  });

  it("says why maps that branch or split are not one chain", () => {
    const nodes = ["a", "b", "c", "d"].map((id) => node(id));
    expect(chainPath({ ...emptyWorkbench, nodes, edges: [edge("1", "a", "b"), edge("2", "a", "c")] })).toEqual({ ok: false, reason: "A node has two maps out of it: a chain is one path." });
    expect(chainPath({ ...emptyWorkbench, nodes, edges: [edge("1", "a", "b"), edge("2", "c", "d")] })).toEqual({ ok: false, reason: "The maps form more than one path." });
    expect(chainPath({ ...emptyWorkbench, nodes, edges: [] })).toEqual({ ok: false, reason: "Draw at least one map." });
  });
});

describe("projection presets", () => {
  it("gives the block-2 and block-3 binary projections written out by hand (c_0 is the leftmost, most significant cell)", () => {
    expect(presetProjection("parity", 2)).toEqual([0, 1, 1, 0]);
    expect(presetProjection("keep", 2, 0)).toEqual([0, 0, 1, 1]);
    expect(presetProjection("keep", 2, 1)).toEqual([0, 1, 0, 1]);
    expect(presetProjection("all-ones", 2)).toEqual([0, 0, 0, 1]);
    expect(presetProjection("any-one", 2)).toEqual([0, 1, 1, 1]);
    expect(presetProjection("majority", 3)).toEqual([0, 0, 0, 1, 0, 1, 1, 1]);
    expect(presetProjection("majority", 2)).toEqual([0, 0, 0, 1]);
  });

  it("refuses a projection that leaves a coarse symbol unused or names too few states", () => {
    expect(projectionIssue([0, 0, 0, 0], 4)).toBe("Every block maps to the same symbol: use at least two coarse symbols.");
    expect(projectionIssue([0, 2, 2, 0], 4)).toBe("Coarse symbol 1 is not used by any block; every symbol must be.");
    expect(projectionIssue([0, 1], 4)).toBe("Give a coarse symbol for each of the 4 block states.");
    expect(projectionIssue([0, 1, 1, 0], 4)).toBeNull();
  });
});

describe("derived models", () => {
  it("says that an ECA's 2-step iterate is a radius-2 binary CA, no longer an ECA", () => {
    const d = derivedModel({ kind: "eca", rule: 90 }, "iterate", 2);
    expect(d.note).toBe("The 2-step iterate of an ECA is a binary radius-2 CA, no longer an ECA.");
    expect(d.name).toBe("rule 90, 2-step iterate");
  });
});

describe("nodeLabel", () => {
  it("names a node by its name, else its model, else numbers the nodes still to be derived", () => {
    const nodes = [node("a", 105), { ...node("b"), name: "" }, { ...node("c"), name: "" }, { ...node("d", 90), name: "" }];
    expect(nodes.map((n) => nodeLabel(nodes, n.id))).toEqual(["a", "model to be derived 1", "model to be derived 2", "ECA 90"]);
  });
});

describe("add-atlas-map", () => {
  const end = (rule: number) => ({ modelId: `m${rule}`, name: `ECA ${rule}`, model: { kind: "eca" as const, rule } });
  const add = (id: string, from: number, to: number, n: number) =>
    ({ type: "add-atlas-map", map: { id, certificateAddress: null, spec: null }, source: end(from), target: end(to), ids: { source: `s${n}`, target: `t${n}`, edge: `e${n}` } }) as const;

  it("continues the path where it ends, even when the second map arrives before the first was drawn", () => {
    // Two maps added in quick succession are both resolved against the canvas as it is when each applies.
    let h = initialHistory();
    h = workbenchReducer(h, add("a", 146, 128, 1));
    h = workbenchReducer(h, add("b", 128, 128, 2));
    expect(h.present.nodes.map((n) => [n.id, n.modelId])).toEqual([
      ["s1", "m146"],
      ["t1", "m128"],
      ["t2", "m128"],
    ]);
    expect(h.present.edges.map((e) => [e.source, e.target, e.state, e.mapId])).toEqual([
      ["s1", "t1", "certified", "a"],
      ["t1", "t2", "certified", "b"],
    ]);
    expect(chainPath(h.present).ok).toBe(true);
    // Undo takes the last map and its new node away.
    expect(workbenchReducer(h, { type: "undo" }).present.nodes.map((n) => n.id)).toEqual(["s1", "t1"]);
  });

  it("adds the same map from the same node only once", () => {
    let h = workbenchReducer(initialHistory(), add("a", 146, 128, 1));
    h = workbenchReducer(h, add("a", 146, 128, 2));
    expect(h.present.edges).toHaveLength(1);
    expect(h.present.nodes).toHaveLength(2);
  });
});
