import { describe, expect, it } from "vitest";
import { evolveCells } from "./evolveCells";
import { ecaTable, type RuleTable } from "./ruleTable";
import { spaceTime, spaceTimeRow } from "./spaceTime";
import { parseRow, randomRow, singleCellRow } from "./spaceTimeRows";

/** Periodic evolution by the plain finite evaluator: pad the row by s·r cells of its own wrap on each side. */
function periodicByPadding(t: RuleTable, row: Uint8Array, s: number): number[] {
  const pad = s * t.r;
  const w = row.length;
  const padded = Array.from({ length: w + 2 * pad }, (_, i) => row[(((i - pad) % w) + w) % w]);
  return Array.from(evolveCells(t, padded, s));
}

describe("spaceTime", () => {
  it("draws rule 90 from one cell as the Sierpinski triangle (cells i−1 XOR i+1)", () => {
    const d = spaceTime(ecaTable(90), singleCellRow(9), 3);
    expect(Array.from(spaceTimeRow(d, 0)).join("")).toBe("000010000");
    expect(Array.from(spaceTimeRow(d, 1)).join("")).toBe("000101000");
    expect(Array.from(spaceTimeRow(d, 2)).join("")).toBe("001000100");
    expect(Array.from(spaceTimeRow(d, 3)).join("")).toBe("010101010");
  });

  it("wraps around the ends: rule 170 copies the right neighbour, so cell 0 moves to the last cell", () => {
    const d = spaceTime(ecaTable(170), [1, 0, 0, 0], 2);
    expect(Array.from(spaceTimeRow(d, 1))).toEqual([0, 0, 0, 1]);
    expect(Array.from(spaceTimeRow(d, 2))).toEqual([0, 0, 1, 0]);
  });

  it("agrees with the plain finite evaluator on a padded row, for every ECA, a k = 3 and an r = 2 rule", () => {
    const rules: RuleTable[] = Array.from({ length: 256 }, (_, r) => ecaTable(r));
    const k3 = Uint8Array.from(randomRow({ k: 3, width: 27, seed: 7 }));
    rules.push({ k: 3, r: 1, table: k3 });
    rules.push({ k: 2, r: 2, table: randomRow({ k: 2, width: 32, seed: 11 }) });
    for (const t of rules) {
      const row = randomRow({ k: t.k, width: 13, seed: 3 });
      const d = spaceTime(t, row, 9);
      for (const s of [1, 4, 9]) expect(Array.from(spaceTimeRow(d, s))).toEqual(periodicByPadding(t, row, s));
    }
  });

  it("keeps the initial row as row 0 and does not change the caller's row", () => {
    const row = Uint8Array.from([0, 1, 1, 0, 1]);
    const d = spaceTime(ecaTable(30), row, 4);
    expect(d.rows).toBe(5);
    expect(Array.from(spaceTimeRow(d, 0))).toEqual([0, 1, 1, 0, 1]);
    expect(Array.from(row)).toEqual([0, 1, 1, 0, 1]);
  });

  it("refuses a cell outside the alphabet, negative steps and an empty row, naming the field", () => {
    expect(() => spaceTime(ecaTable(30), [0, 2], 1)).toThrow(/initial: cell 1 is 2/);
    expect(() => spaceTime(ecaTable(30), [0, 1], -1)).toThrow(/steps/);
    expect(() => spaceTime(ecaTable(30), [], 1)).toThrow(/width/);
  });
});

describe("rows", () => {
  it("gives the same random row for the same seed and another for another seed", () => {
    expect(Array.from(randomRow({ k: 2, width: 64, seed: 42 }))).toEqual(Array.from(randomRow({ k: 2, width: 64, seed: 42 })));
    expect(Array.from(randomRow({ k: 2, width: 64, seed: 42 }))).not.toEqual(Array.from(randomRow({ k: 2, width: 64, seed: 43 })));
  });

  it("draws every symbol of the alphabet about equally often", () => {
    const row = randomRow({ k: 3, width: 30_000, seed: 1 });
    const counts = [0, 0, 0];
    for (const v of row) counts[v]++;
    for (const c of counts) expect(c / row.length).toBeGreaterThan(0.31);
    for (const c of counts) expect(c / row.length).toBeLessThan(0.36);
  });

  it("refuses a seed that is not a 32-bit whole number", () => {
    expect(() => randomRow({ k: 2, width: 4, seed: -1 })).toThrow(/seed/);
    expect(() => randomRow({ k: 2, width: 4, seed: 1.5 })).toThrow(/seed/);
  });

  it("reads a typed row, ignoring spaces and commas, and names a bad cell's position", () => {
    expect(Array.from(parseRow("01 1,0", 2))).toEqual([0, 1, 1, 0]);
    expect(Array.from(parseRow("0a2", 11))).toEqual([0, 10, 2]);
    expect(() => parseRow("0120", 2)).toThrow(/cell 3 is “2”/);
    expect(() => parseRow("  ", 2)).toThrow(/at least one cell/);
  });
});
