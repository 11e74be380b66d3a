import { describe, expect, it } from "vitest";
import { canvasFromMaps, type AtlasMapView } from "./canvasFromMaps";
import { edgeText } from "./workbench-canvas";

const eca = (rule: number) => ({ id: `m${rule}`, name: `ECA ${rule}`, model: { kind: "eca" as const, rule } });
const map = (id: string, from: number, to: number, kind = "projection", block: number | null = 2, steps: number | null = 2): AtlasMapView => ({
  id,
  kind,
  block,
  steps,
  certificateAddress: `sha256:${id}`,
  source: eca(from),
  target: eca(to),
});

describe("canvasFromMaps", () => {
  it("continues a path from the node the last map ended at, with a node of its own for a map from a model to itself", () => {
    const w = canvasFromMaps([map("a", 146, 128, "projection", 3, 3), map("b", 128, 128)], { width: 190, height: 94 });
    expect(w.nodes.map((n) => [n.id, n.name, n.modelId])).toEqual([
      ["n1", "ECA 146", "m146"],
      ["n2", "ECA 128", "m128"],
      ["n3", "ECA 128", "m128"],
    ]);
    expect(w.edges).toEqual([
      { id: "e1", source: "n1", target: "n2", spec: null, state: "certified", mapId: "a", certificateAddress: "sha256:a", problem: null, atlasText: "projection N=3 T=3" },
      { id: "e2", source: "n2", target: "n3", spec: null, state: "certified", mapId: "b", certificateAddress: "sha256:b", problem: null, atlasText: "projection N=2 T=2" },
    ]);
    // The canvas says what each stored map is rather than only that it is certified.
    expect(w.edges.map(edgeText)).toEqual(["projection N=3 T=3", "projection N=2 T=2"]);
  });

  it("keeps two maps that do not meet as two separate paths, and shows a decimation's steps", () => {
    const w = canvasFromMaps([map("a", 146, 128), map("b", 90, 60, "iterate", null, 2)], { width: 190, height: 94 });
    expect(w.nodes.map((n) => n.name)).toEqual(["ECA 146", "ECA 128", "ECA 90", "ECA 60"]);
    expect(w.edges.map((e) => [e.source, e.target, e.spec])).toEqual([
      ["n1", "n2", null],
      ["n3", "n4", { kind: "iterate", steps: 2 }],
    ]);
    // Laid out: the target of a map sits below its source.
    const y = Object.fromEntries(w.nodes.map((n) => [n.name, n.y]));
    expect(y["ECA 128"]).toBeGreaterThan(y["ECA 146"]);
  });

  it("shows a lumping's partition with the source chain's labels, and a decimation's steps and states", () => {
    // An invented six-state chain; the partition is what its certificate states.
    const chain = { kind: "markov" as const, labels: ["a", "b", "c", "d", "e", "f"], matrix: Array.from({ length: 6 }, (_, i) => Array.from({ length: 6 }, (_, j) => (i === j ? "1" : "0"))) };
    const lumped = { kind: "markov" as const, labels: ["{a,b}", "{c,d}", "{e,f}"], matrix: [["1", "0", "0"], ["0", "1", "0"], ["0", "0", "1"]] };
    const lump: AtlasMapView = {
      id: "l",
      kind: "lumping",
      block: null,
      steps: 1,
      certificateAddress: "sha256:l",
      source: { id: "c6", name: "Six", model: chain },
      target: { id: "c3", name: "Three", model: lumped },
      partition: [0, 0, 1, 1, 2, 2],
    };
    const decimate: AtlasMapView = { ...lump, id: "d", kind: "decimation", steps: 2, source: lump.target, target: { ...lump.target, id: "c3b" }, partition: null };
    const w = canvasFromMaps([lump, decimate], { width: 190, height: 94 });
    expect(w.edges.map(edgeText)).toEqual(["lumping 6 → 3: {a,b} {c,d} {e,f}", "decimation k=2, 3 states"]);
  });
});
