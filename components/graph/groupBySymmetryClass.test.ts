import { describe, expect, it } from "vitest";
import { groupBySymmetryClass, type ClassMember } from "./groupBySymmetryClass";

// Symmetry classes of ECAs under reflection and complement (common practice; Wolfram 1983 lists
// the 88 classes): {30, 86, 135, 149}, {90, 165}, {0, 255}, {128, 254}.
const eca = (rule: number, symmetryClass: number): ClassMember => ({ id: `eca-${rule}`, rule, symmetryClass });
const members = [eca(30, 30), eca(86, 30), eca(135, 30), eca(149, 30), eca(90, 90), eca(165, 90), eca(0, 0), eca(255, 0), eca(128, 128)];

describe("groupBySymmetryClass", () => {
  it("makes one node per class, named by its smallest rule, listing its rules in order", () => {
    const { nodes, groups } = groupBySymmetryClass(members, []);
    expect(nodes.map((n) => n.label)).toEqual(["class 0", "class 30", "class 90", "class 128"]);
    expect(groups.find((g) => g.symmetryClass === 30)!.rules).toEqual([30, 86, 135, 149]);
    expect(nodes[1].detail).toBe("ECA 30, 86, 135, 149");
    expect(nodes[1].href).toBe("/atlas?class=30");
  });

  it("merges maps between the same two classes into one edge labelled with their block sizes", () => {
    const maps = [
      { id: "a", sourceModelId: "eca-90", targetModelId: "eca-0", block: 2 },
      { id: "b", sourceModelId: "eca-165", targetModelId: "eca-255", block: 3 },
      { id: "c", sourceModelId: "eca-90", targetModelId: "eca-0", block: 2 },
    ];
    const { edges } = groupBySymmetryClass(members, maps);
    expect(edges).toEqual([
      { id: "90->0", source: "class-90", target: "class-0", label: "N=2,3 · 3 maps", retracted: false },
    ]);
  });

  it("shows maps within one class as a loop label on its node, not as an edge", () => {
    const maps = [
      { id: "x", sourceModelId: "eca-30", targetModelId: "eca-86", block: 2 },
      { id: "y", sourceModelId: "eca-30", targetModelId: "eca-30", block: 3 },
    ];
    const { edges, nodes } = groupBySymmetryClass(members, maps);
    expect(edges).toEqual([]);
    expect(nodes.find((n) => n.id === "class-30")!.loop).toBe("N=2,3 · 2 maps");
    expect(nodes.find((n) => n.id === "class-90")!.loop).toBeUndefined();
  });

  it("marks an edge retracted only when every map behind it is retracted", () => {
    const maps = [
      { id: "a", sourceModelId: "eca-128", targetModelId: "eca-0", block: 2, retracted: true },
      { id: "b", sourceModelId: "eca-90", targetModelId: "eca-0", block: 2, retracted: true },
      { id: "c", sourceModelId: "eca-90", targetModelId: "eca-255", block: 3 },
    ];
    const byId = Object.fromEntries(groupBySymmetryClass(members, maps).edges.map((e) => [e.id, e.retracted]));
    expect(byId).toEqual({ "128->0": true, "90->0": false });
  });

  it("ignores maps that touch models outside the ECA members", () => {
    const maps = [{ id: "a", sourceModelId: "markov-1", targetModelId: "eca-0", block: null }];
    expect(groupBySymmetryClass(members, maps).edges).toEqual([]);
  });
});
