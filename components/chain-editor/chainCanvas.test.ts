import { describe, expect, it } from "vitest";
import { chainCanvas } from "./chainCanvas";
import { checkChain, type EditorLink } from "./chainEditorState";

function link(mapId: string, source: string, target: string, status: EditorLink["status"] = "certified"): EditorLink {
  return { mapId, kind: "lumping", block: null, steps: null, summary: "", status, source: { id: source, name: source }, target: { id: target, name: target } };
}

describe("chainCanvas", () => {
  it("shares one node where a link meets the next, so a chain of n links has n + 1 nodes", () => {
    const links = [link("1", "a", "b"), link("2", "b", "c"), link("3", "c", "d")];
    const { nodes, edges } = chainCanvas(links, checkChain(links));
    expect(nodes.map((n) => n.label)).toEqual(["a", "b", "c", "d"]);
    expect(edges.map((e) => [e.source, e.target, e.type])).toEqual([
      ["n0-source", "n0-target", "link"],
      ["n0-target", "n1-target", "link"],
      ["n1-target", "n2-target", "link"],
    ]);
    expect(new Set(nodes.map((n) => n.x)).size).toBe(4);
  });

  it("draws a gap edge at the link that does not meet the next and marks both ends broken", () => {
    const links = [link("1", "a", "b"), link("2", "x", "c")];
    const { nodes, edges } = chainCanvas(links, checkChain(links));
    expect(nodes.map((n) => [n.label, n.broken])).toEqual([["a", false], ["b", true], ["x", true], ["c", false]]);
    const gap = edges.find((e) => e.type === "gap")!;
    expect(gap).toMatchObject({ source: "n0-target", target: "n1-source", index: 0, problem: true, label: "does not meet" });
  });

  it("flags retracted links and the link the server refused", () => {
    const links = [link("1", "a", "b", "retracted"), link("2", "b", "c"), link("3", "c", "d")];
    const { edges } = chainCanvas(links, checkChain(links), 2);
    expect(edges.map((e) => e.problem)).toEqual([true, false, true]);
  });

  it("draws nothing for an empty chain", () => {
    expect(chainCanvas([], checkChain([]))).toEqual({ nodes: [], edges: [] });
  });
});
