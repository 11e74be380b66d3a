import { describe, expect, it } from "vitest";
import { canonicalView, prettyJson } from "./canonicalView";

describe("canonicalView", () => {
  it("reads a Markov chain's labels and exact matrix", () => {
    const json = JSON.stringify({ kind: "markov", labels: ["R", "N", "S"], matrix: [["1/2", "1/4", "1/4"], ["1/2", "0", "1/2"], ["1/4", "1/4", "1/2"]] });
    expect(canonicalView(json)).toEqual({ type: "markov", labels: ["R", "N", "S"], matrix: [["1/2", "1/4", "1/4"], ["1/2", "0", "1/2"], ["1/4", "1/4", "1/2"]] });
  });

  it("reads an ECA by rule number, and a k=2, r=1 table as the ECA whose bits it spells (rule 110 = 01101110₂, Wolfram 1983)", () => {
    expect(canonicalView(JSON.stringify({ kind: "eca", rule: 146 }))).toEqual({ type: "eca", rule: 146 });
    const table110 = [0, 1, 1, 1, 0, 1, 1, 0];
    expect(canonicalView(JSON.stringify({ kind: "ca", k: 2, r: 1, table: table110 }))).toEqual({ type: "eca", rule: 110 });
  });

  it("reads a general CA table and a derived supercell with its base", () => {
    const ca = { kind: "ca", k: 3, r: 1, table: Array.from({ length: 27 }, (_, i) => i % 3) };
    expect(canonicalView(JSON.stringify(ca))).toEqual({ type: "ca", k: 3, r: 1, table: ca.table });
    expect(canonicalView(JSON.stringify({ kind: "supercell", base: { kind: "eca", rule: 30 }, block: 2, steps: 2 }))).toEqual({
      type: "derived",
      kind: "supercell",
      base: { type: "eca", rule: 30 },
      block: 2,
      steps: 2,
    });
  });

  it("shows anything it cannot read as unknown", () => {
    expect(canonicalView("{not json")).toEqual({ type: "unknown" });
    expect(canonicalView(JSON.stringify({ kind: "eca", rule: 300 }))).toEqual({ type: "unknown" });
    expect(canonicalView("null")).toEqual({ type: "unknown" });
  });
});

describe("prettyJson", () => {
  it("keeps rows and projections on one line and parses back to the same value", () => {
    const value = { kind: "markov", matrix: [["1/2", "1/2"], ["1/4", "3/4"]], projection: [0, 1, 1, 0], nested: { a: [], b: {} } };
    const text = prettyJson(JSON.stringify(value));
    expect(text).toContain('    ["1/2", "1/2"],');
    expect(text).toContain('"projection": [0, 1, 1, 0]');
    expect(JSON.parse(text)).toEqual(value);
  });

  it("returns text that is not JSON unchanged", () => {
    expect(prettyJson("not json")).toBe("not json");
  });
});
