import { describe, expect, it } from "vitest";
import { approximate, blockOrder } from "./heatMapLayout";

describe("heat map layout", () => {
  it("approximates exact entries for shading", () => {
    expect(approximate("1/4")).toBe(0.25);
    expect(approximate("1")).toBe(1);
    expect(approximate("0")).toBe(0);
  });

  it("groups states by block and marks where each inner block ends", () => {
    // ward compartments: {susceptible}, {exposed, infectious}, {recovered}
    expect(blockOrder([0, 1, 1, 2], 4)).toEqual({ order: [0, 1, 2, 3], ends: new Set([0, 2]) });
    // twin-bay parity lumping of the one-bay chain: {empty, both}, {one busy}
    expect(blockOrder([0, 1, 0], 3)).toEqual({ order: [0, 2, 1], ends: new Set([1]) });
    expect(blockOrder(null, 2)).toEqual({ order: [0, 1], ends: new Set() });
  });
});
