import { describe, expect, it } from "vitest";
import { connectedComponents, layoutGraph, layoutPacked, neighbourhood } from "./layout";
import type { GraphEdge, GraphNode } from "./types";

const node = (id: string): GraphNode => ({ id, label: id });
const edge = (source: string, target: string): GraphEdge => ({ id: `${source}->${target}`, source, target });

function overlaps(a: { x: number; y: number; width: number; height: number }, b: typeof a): boolean {
  return a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;
}

describe("layoutGraph", () => {
  it("places every source above its target in a top-to-bottom layout of a chain of coarse-grainings", () => {
    const nodes = ["ECA 146", "ECA 128", "ECA 0"].map(node);
    const edges = [edge("ECA 146", "ECA 128"), edge("ECA 128", "ECA 0")];
    const { nodes: placed } = layoutGraph(nodes, edges);
    const y = Object.fromEntries(placed.map((n) => [n.id, n.y]));
    expect(y["ECA 146"]).toBeLessThan(y["ECA 128"]);
    expect(y["ECA 128"]).toBeLessThan(y["ECA 0"]);
  });

  it("places sources left of targets when asked for a left-to-right layout", () => {
    const { nodes: placed } = layoutGraph([node("a"), node("b")], [edge("a", "b")], { direction: "LR" });
    const [a, b] = ["a", "b"].map((id) => placed.find((n) => n.id === id)!);
    expect(a.x + a.width).toBeLessThanOrEqual(b.x);
  });

  it("gives no two nodes overlapping boxes, isolated nodes included", () => {
    const nodes = Array.from({ length: 12 }, (_, i) => node(`m${i}`));
    const edges = [edge("m0", "m1"), edge("m0", "m2"), edge("m3", "m2"), edge("m4", "m4")];
    const { nodes: placed } = layoutGraph(nodes, edges);
    expect(placed).toHaveLength(12);
    for (let i = 0; i < placed.length; i++)
      for (let j = i + 1; j < placed.length; j++) expect(overlaps(placed[i], placed[j])).toBe(false);
  });

  it("returns top-left corners inside the reported drawing size", () => {
    const layout = layoutGraph([node("a"), node("b"), node("c")], [edge("a", "b"), edge("a", "c")]);
    for (const n of layout.nodes) {
      expect(n.x).toBeGreaterThanOrEqual(0);
      expect(n.y).toBeGreaterThanOrEqual(0);
      expect(n.x + n.width).toBeLessThanOrEqual(layout.width);
      expect(n.y + n.height).toBeLessThanOrEqual(layout.height);
    }
  });

  it("drops edges to unknown nodes and duplicate nodes instead of inventing nodes", () => {
    const layout = layoutGraph([node("a"), node("a"), node("b")], [edge("a", "b"), edge("a", "ghost")]);
    expect(layout.nodes.map((n) => n.id).sort()).toEqual(["a", "b"]);
    expect(layout.edges.map((e) => e.id)).toEqual(["a->b"]);
  });

  it("keeps parallel edges between the same pair (two maps at different block sizes)", () => {
    const edges = [
      { id: "n2", source: "a", target: "b", label: "N=2" },
      { id: "n3", source: "a", target: "b", label: "N=3" },
    ];
    expect(layoutGraph([node("a"), node("b")], edges).edges).toHaveLength(2);
  });

  it("does not mutate its inputs", () => {
    const nodes = [node("a"), node("b")];
    const edges = [edge("a", "b")];
    const copy = structuredClone({ nodes, edges });
    layoutGraph(nodes, edges);
    expect({ nodes, edges }).toEqual(copy);
  });
});

describe("connectedComponents", () => {
  it("splits a graph into its weakly connected parts, largest first, each node once", () => {
    const nodes = ["a", "b", "c", "d", "e", "a"].map(node);
    const parts = connectedComponents(nodes, [edge("a", "b"), edge("c", "b"), edge("d", "d"), edge("e", "ghost")]);
    expect(parts.map((p) => p.nodes.map((n) => n.id).sort())).toEqual([["a", "b", "c"], ["d"], ["e"]]);
    expect(parts[0].edges).toHaveLength(2);
    expect(parts[2].edges).toEqual([]);
  });
});

describe("layoutPacked", () => {
  const many = Array.from({ length: 30 }, (_, i) => [node(`s${i}`), node(`t${i}`)]).flat();
  const pairs = Array.from({ length: 30 }, (_, i) => edge(`s${i}`, `t${i}`));

  it("packs many small families into rows no wider than asked, without overlaps", () => {
    const layout = layoutPacked(many, pairs, { maxWidth: 800 });
    expect(layout.nodes).toHaveLength(60);
    expect(layout.edges).toHaveLength(30);
    expect(layout.width).toBeLessThanOrEqual(800);
    for (const n of layout.nodes) expect(n.x + n.width).toBeLessThanOrEqual(layout.width + 1e-9);
    for (let i = 0; i < layout.nodes.length; i++)
      for (let j = i + 1; j < layout.nodes.length; j++) expect(overlaps(layout.nodes[i], layout.nodes[j])).toBe(false);
  });

  it("keeps each family's sources above its targets", () => {
    const layout = layoutPacked(many, pairs, { maxWidth: 800 });
    const at = new Map(layout.nodes.map((n) => [n.id, n]));
    for (let i = 0; i < 30; i++) expect(at.get(`s${i}`)!.y).toBeLessThan(at.get(`t${i}`)!.y);
  });

  it("is much less wide than one layered layout of the same graph", () => {
    expect(layoutPacked(many, pairs, { maxWidth: 1100 }).width).toBeLessThan(layoutGraph(many, pairs).width / 3);
  });
});

describe("neighbourhood", () => {
  // 146 → 128 → 0 ← 90 ← 60, and 30 → 30 off to the side.
  const nodes = ["146", "128", "0", "90", "60", "30"].map(node);
  const edges = [edge("146", "128"), edge("128", "0"), edge("90", "0"), edge("60", "90"), edge("30", "30")];

  it("keeps what a class coarse-grains onto and what coarse-grains onto it, not its siblings", () => {
    const part = neighbourhood(nodes, edges, "128");
    expect(part.nodes.map((n) => n.id).sort()).toEqual(["0", "128", "146"]);
    expect(part.edges.map((e) => e.id).sort()).toEqual(["128->0", "146->128"]);
  });

  it("gives every ancestor of a sink", () => {
    expect(neighbourhood(nodes, edges, "0").nodes.map((n) => n.id).sort()).toEqual(["0", "128", "146", "60", "90"]);
  });

  it("gives nothing for an unknown node, and the node alone when it has no edges", () => {
    expect(neighbourhood(nodes, edges, "7")).toEqual({ nodes: [], edges: [] });
    expect(neighbourhood(nodes, edges, "30")).toEqual({ nodes: [node("30")], edges: [edge("30", "30")] });
  });
});
