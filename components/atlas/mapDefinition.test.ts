import { describe, expect, it } from "vitest";
import { describeDefinition, describePartition, describeProjection } from "./mapDefinition";
import { modelMapsHref, parseModelMapFilters } from "./modelMapFilters";

describe("describeProjection", () => {
  it("names rule 146 → 128's projection: only the block 111 is 1", () => {
    expect(describeProjection([0, 0, 0, 0, 0, 0, 0, 1], 3)).toMatchObject({ symbols: "00000001", name: "all 3 cells 1" });
  });

  it("names parity at block 2 (00→0, 01→1, 10→1, 11→0) and tells it apart from the first cell (00→0, 01→0, 10→1, 11→1)", () => {
    expect(describeProjection([0, 1, 1, 0], 2).name).toBe("parity");
    expect(describeProjection([0, 0, 1, 1], 2).name).toBe("first cell");
  });

  it("names majority at block 3 and leaves an unfamiliar projection unnamed", () => {
    expect(describeProjection([0, 0, 0, 1, 0, 1, 1, 1], 3).name).toBe("majority");
    expect(describeProjection([0, 0, 0, 0, 0, 1, 0, 0], 3)).toMatchObject({ name: null, symbols: "00000100" });
  });

  it("spells every block state in the hover text", () => {
    expect(describeProjection([0, 1, 1, 0], 2).title).toBe("projection: 00→0, 01→1, 10→1, 11→0");
  });
});

describe("describePartition", () => {
  it("writes the blocks of the ward lumping", () => {
    expect(describePartition([0, 1, 1, 2], ["S", "E", "I", "R"]).symbols).toBe("{S} {E, I} {R}");
    expect(describeDefinition("lumping", "[0,1,0]", null)?.symbols).toBe("{0, 2} {1}");
  });

  it("has nothing to say for a decimation or broken JSON", () => {
    expect(describeDefinition("decimation", null, null)).toBeNull();
    expect(describeDefinition("projection", "[", 2)).toBeNull();
  });
});

describe("model map filters in the URL", () => {
  it("reads each side's filters and ignores bad values", () => {
    const f = parseModelMapFilters({ okind: "projection", oblock: "3", fclass: "x", fconst: "1", fcursor: "abc" }, ["projection", "lumping"]);
    expect(f.o).toEqual({ kind: "projection", block: 3, cls: undefined, cursor: undefined, constants: false });
    expect(f.f).toEqual({ kind: undefined, block: undefined, cls: undefined, cursor: "abc", constants: true });
  });

  it("keeps the other side's filters when one side changes", () => {
    const f = parseModelMapFilters({ okind: "projection", fblock: "2" }, ["projection"]);
    expect(modelMapsHref("/atlas/models/m", f, "f", { block: 3 })).toBe("/atlas/models/m?okind=projection&fblock=3#maps-f");
  });
});
