import { describe, expect, it } from "vitest";
import { cellPalette } from "./palette";

describe("cellPalette", () => {
  it("draws a binary CA in paper (#fffdf8) and tide (#16544f), not black and white", () => {
    expect(cellPalette(2)).toEqual([
      [0xff, 0xfd, 0xf8],
      [0x16, 0x54, 0x4f],
    ]);
  });

  it("gives k different colours for every alphabet up to 16, paper first", () => {
    for (let k = 2; k <= 16; k++) {
      const p = cellPalette(k);
      expect(p).toHaveLength(k);
      expect(new Set(p.map((c) => c.join(","))).size).toBe(k);
      expect(p[0]).toEqual([0xff, 0xfd, 0xf8]);
    }
  });
});
