import { describe, expect, it } from "vitest";
import { evolveCells, toDigits } from "@/lib/ca";
import { LightCone } from "./lightCone";

/** The centre cell after `steps` applications of the rule to a row of cells, by the core's plain evaluation (lib/ca). */
function evolveCentre(rule: Uint8Array, r: number, cells: ArrayLike<number>, steps: number): number {
  return evolveCells({ k: 2, r, table: rule }, cells, steps)[0];
}

function digits(x: number, count: number): Uint8Array {
  return toDigits(x, 2, count);
}

describe("light cone as bits", () => {
  // (r, T): the rule alone, a level shorter than a word below T (r = 1, T = 2), and sliced levels (r = 2, T = 2, 3)
  const cases: [number, number][] = [[1, 1], [1, 2], [1, 3], [1, 4], [2, 1], [2, 2], [2, 3]];
  it.each(cases)("gives f^T of every pattern as the rule applied cell by cell does (r = %i, T = %i), rule after rule in one reused cone", (r, T) => {
    const cone = new LightCone(r, T);
    const width = 2 * r * T + 1;
    // ECA 110 and 30 (r = 1, Wolfram numbering, DOMAIN.md §1) and a fixed radius-2 table, then the identity
    const rules = r === 1 ? [110, 30].map((n) => Uint8Array.from({ length: 8 }, (_, i) => (n >>> i) & 1)) : [Uint8Array.from({ length: 32 }, (_, i) => ((i * 0x9e3779b1) >>> 13) & 1)];
    rules.push(Uint8Array.from({ length: 2 ** (2 * r + 1) }, (_, i) => (i >>> r) & 1));
    for (const table of rules) {
      cone.load({ k: 2, r, table });
      // read in a scattered order, so that words are built on first use in no particular order
      for (let i = 0; i < 2 ** width; i++) {
        const x = (i * 0x5bd1) & (2 ** width - 1);
        expect(cone.cell(x)).toBe(evolveCentre(table, r, digits(x, width), T));
      }
    }
  });
});
