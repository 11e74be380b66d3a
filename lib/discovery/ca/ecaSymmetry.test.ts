import { describe, expect, it } from "vitest";
import { supercellTable, ecaTable } from "@/lib/ca";
import { complementRule, ecaSymmetryClasses, reflectRule, symmetryClass } from "@/lib/symmetry";
import { ecaClasses } from "./ecaClasses";
import { complementEca, ecaClassRepresentative, reflectEca } from "./ecaSymmetry";
import { ecaSupercell } from "./supercell";

describe("search-side ECA symmetries and supercells", () => {
  it("agree with the core's reflection, complement and 88 classes (DOMAIN.md §4)", () => {
    for (let rule = 0; rule < 256; rule++) {
      expect(reflectEca(rule)).toBe(reflectRule(rule));
      expect(complementEca(rule)).toBe(complementRule(rule));
      expect(ecaClassRepresentative(rule)).toBe(symmetryClass(rule));
    }
    const mine = ecaClasses().map((c) => [c.representative, [...c.members].sort((a, b) => a - b)]);
    const core = ecaSymmetryClasses().map((c) => [c.representative, [...c.members].sort((a, b) => a - b)]);
    expect(mine).toHaveLength(88);
    expect(new Map(mine as [number, number[]][])).toEqual(new Map(core as [number, number[]][]));
  });

  it("builds the same supercell tables as the core for every ECA at N = 1..4 and a sample at N = 5..6", () => {
    for (let N = 1; N <= 4; N++)
      for (let rule = 0; rule < 256; rule++) expect(Array.from(ecaSupercell(rule, N).out)).toEqual(Array.from(supercellTable(ecaTable(rule), N).table));
    for (const [rule, N] of [
      [30, 5],
      [110, 6],
      [146, 5],
    ])
      expect(Array.from(ecaSupercell(rule, N).out)).toEqual(Array.from(supercellTable(ecaTable(rule), N).table));
  });
});
