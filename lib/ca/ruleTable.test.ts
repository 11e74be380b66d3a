import { describe, expect, it } from "vitest";
import { CaInputError, assertRuleTable, ecaRuleOf, ecaTable, evolveCells, supercellRadius } from "./index";

describe("ECA rule tables (Wolfram code, Wolfram, Rev. Mod. Phys. 55, 601, 1983)", () => {
  it("round-trips every rule number through its table", () => {
    for (let rule = 0; rule < 256; rule++) expect(ecaRuleOf(ecaTable(rule))).toBe(rule);
  });

  it("makes rule 204 the identity, 170 copy the right neighbour and 240 the left one", () => {
    const row = [0, 1, 1, 0, 1, 0, 0, 1];
    expect(Array.from(evolveCells(ecaTable(204), row, 1))).toEqual(row.slice(1, -1));
    expect(Array.from(evolveCells(ecaTable(170), row, 1))).toEqual(row.slice(2));
    expect(Array.from(evolveCells(ecaTable(240), row, 1))).toEqual(row.slice(0, -2));
  });

  it("reads a neighbourhood with the leftmost cell most significant: rule 1 << 4 fires only on 100", () => {
    expect(Array.from(evolveCells(ecaTable(16), [1, 0, 0], 1))).toEqual([1]);
    expect(Array.from(evolveCells(ecaTable(16), [0, 0, 1], 1))).toEqual([0]);
  });

  it("has no ECA number for other alphabets or radii", () => {
    expect(ecaRuleOf({ k: 3, r: 1, table: new Uint8Array(27) })).toBeNull();
    expect(ecaRuleOf({ k: 2, r: 2, table: new Uint8Array(32) })).toBeNull();
  });

  it("refuses rule numbers and tables outside the encoding", () => {
    for (const bad of [-1, 256, 1.5, NaN]) expect(() => ecaTable(bad)).toThrow(CaInputError);
    expect(() => assertRuleTable({ k: 2, r: 1, table: new Uint8Array(7) })).toThrow(/expected 8 entries/);
    expect(() => assertRuleTable({ k: 2, r: 1, table: Uint8Array.from([0, 1, 2, 0, 0, 0, 0, 0]) })).toThrow(/outside the alphabet/);
    expect(() => assertRuleTable({ k: 1, r: 1, table: new Uint8Array(1) })).toThrow(CaInputError);
  });

  it("gives the supercell radius R = ceil(rT/N) of DOMAIN.md §2", () => {
    expect(supercellRadius(1, 8, 8)).toBe(1);
    expect(supercellRadius(1, 2, 3)).toBe(2);
    expect(supercellRadius(2, 3, 3)).toBe(2);
  });
});
