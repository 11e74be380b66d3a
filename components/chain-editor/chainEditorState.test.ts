import { describe, expect, it } from "vitest";
import { checkChain, editorReducer, emptyEditor, nextCandidates, type EditorLink } from "./chainEditorState";

const model = (id: string) => ({ id, name: id.toUpperCase() });
function link(mapId: string, source: string, target: string, status: EditorLink["status"] = "certified"): EditorLink {
  return { mapId, kind: "coarse-graining", block: 2, steps: 2, summary: `${source}→${target}`, status, source: model(source), target: model(target) };
}
const ab = link("m1", "a", "b");
const bc = link("m2", "b", "c");
const cd = link("m3", "c", "d");
const xy = link("m4", "x", "y");

describe("checkChain", () => {
  it("accepts a chain in which every target is the next source", () => {
    expect(checkChain([ab, bc, cd])).toEqual({ ready: true, breaks: [], retracted: [] });
  });

  it("names the link that does not meet the next, with the model expected and the one found", () => {
    expect(checkChain([ab, xy, cd]).breaks).toEqual([
      { index: 0, expected: model("b"), found: model("x") },
      { index: 1, expected: model("y"), found: model("c") },
    ]);
    expect(checkChain([ab, xy]).ready).toBe(false);
  });

  it("refuses a chain with a retracted map, and an empty chain", () => {
    const check = checkChain([ab, link("m5", "b", "c", "retracted")]);
    expect(check).toMatchObject({ ready: false, breaks: [], retracted: [1] });
    expect(checkChain([]).ready).toBe(false);
  });

  it("accepts a single link and a loop back onto the same model", () => {
    expect(checkChain([ab]).ready).toBe(true);
    expect(checkChain([link("l", "a", "a"), link("l2", "a", "a")]).ready).toBe(true);
  });
});

describe("editorReducer", () => {
  it("appends, moves and removes links, and moving back restores the order", () => {
    let s = [ab, bc, cd].reduce((st, l) => editorReducer(st, { type: "append", link: l }), emptyEditor);
    s = editorReducer(s, { type: "move", from: 2, to: 0 });
    expect(s.links.map((l) => l.mapId)).toEqual(["m3", "m1", "m2"]);
    s = editorReducer(s, { type: "move", from: 0, to: 2 });
    expect(s.links.map((l) => l.mapId)).toEqual(["m1", "m2", "m3"]);
    s = editorReducer(s, { type: "remove", index: 1 });
    expect(s.links.map((l) => l.mapId)).toEqual(["m1", "m3"]);
  });

  it("ignores moves and removals out of range without copying the state", () => {
    const s = editorReducer(emptyEditor, { type: "append", link: ab });
    expect(editorReducer(s, { type: "remove", index: 3 })).toBe(s);
    expect(editorReducer(s, { type: "move", from: 0, to: 5 })).toBe(s);
  });

  it("keeps the server's problem until the chain is edited", () => {
    let s = editorReducer(emptyEditor, { type: "append", link: ab });
    s = editorReducer(s, { type: "server-problem", problem: { link: 0, message: "does not compose" } });
    expect(s.problem).toEqual({ link: 0, message: "does not compose" });
    expect(editorReducer(s, { type: "append", link: bc }).problem).toBeNull();
    expect(editorReducer(s, { type: "clear" })).toEqual(emptyEditor);
  });

  it("does not mutate the previous state", () => {
    const s = editorReducer(editorReducer(emptyEditor, { type: "append", link: ab }), { type: "append", link: bc });
    const before = structuredClone(s);
    editorReducer(s, { type: "move", from: 0, to: 1 });
    editorReducer(s, { type: "remove", index: 0 });
    expect(s).toEqual(before);
  });
});

describe("nextCandidates", () => {
  it("offers the certified maps that start where the chain ends, or all certified maps for an empty chain", () => {
    const pool = [ab, bc, cd, xy, link("m9", "b", "z", "retracted")];
    expect(nextCandidates([ab], pool).map((l) => l.mapId)).toEqual(["m2"]);
    expect(nextCandidates([], pool).map((l) => l.mapId)).toEqual(["m1", "m2", "m3", "m4"]);
  });
});
