import { describe, expect, it } from "vitest";
import { evolveCells, toDigits } from "@/lib/ca";
import type { ConeWords } from "./lightCone";
import { SlicedWindowCheck } from "./slicedWindowCheck";
import { seededRandom } from "@/lib/random";

/** The centre cell after `steps` applications of the rule to a row of cells, by the core's plain evaluation (lib/ca). */
function evolveCentre(rule: Uint8Array, r: number, cells: ArrayLike<number>, steps: number): number {
  return evolveCells({ k: 2, r, table: rule }, cells, steps)[0];
}

function digits(x: number, count: number): Uint8Array {
  return toDigits(x, 2, count);
}

/** Level `steps` of the light cone, evolved cell by cell, read a word at a time as the check reads it. */
function cone(rule: Uint8Array, r: number, steps: number): ConeWords {
  const width = 2 * r * steps + 1;
  const full = Uint8Array.from({ length: 2 ** width }, (_, x) => evolveCentre(rule, r, digits(x, width), steps));
  return { word: (q) => full.subarray(32 * q, 32 * q + 32).reduce((word, v, i) => word | (v << i), 0) };
}

/** Plain check: each window evolved cell by cell, its image block projected, compared per coarse window. */
function plainCheck(rule: Uint8Array, r: number, N: number, T: number, p: number[]): Map<number, number> | null {
  const R = Math.ceil((r * T) / N);
  const width = 2 * R + 1;
  const g = new Map<number, number>();
  for (let w = 0; w < 2 ** (width * N); w++) {
    const cells = digits(w, width * N);
    let image = 0;
    // output cell j sits at window cell RN + j; its cone starts rT cells to its left
    for (let j = 0; j < N; j++) image = image * 2 + evolveCentre(rule, r, cells.slice(R * N + j - r * T, R * N + j + r * T + 1), T);
    let c = 0;
    for (let b = 0; b < width; b++) c = c * 2 + p[(w >>> ((width - 1 - b) * N)) & (2 ** N - 1)];
    const seen = g.get(c);
    if (seen === undefined) g.set(c, p[image]);
    else if (seen !== p[image]) return null;
  }
  return g;
}

function slicedCheck(t: ConeWords, r: number, N: number, T: number, p: number[]): Map<number, number> | null {
  const R = Math.ceil((r * T) / N);
  const width = 2 * R + 1;
  const cells = width * N;
  const coneMask = 2 ** (2 * r * T + 1) - 1;
  const coneShift = Int32Array.from({ length: N }, (_, j) => cells - 1 - (R * N + j + r * T));
  if (!SlicedWindowCheck.applies(N, width, coneMask)) throw new Error("sizes do not line up");
  const g = new Int8Array(2 ** width).fill(-1);
  const trail: number[] = [];
  if (!new SlicedWindowCheck(t, N, width, coneShift, coneMask).check(Int8Array.from(p), g, trail, 7)) return null;
  // the trail records exactly the bits of g it set
  expect(trail.filter((_, i) => i % 2 === 0).every((k) => k === 7)).toBe(true);
  expect(new Set(trail.filter((_, i) => i % 2 === 1))).toEqual(new Set([...g.keys()].filter((c) => g[c] >= 0)));
  return new Map([...g.entries()].filter(([, v]) => v >= 0));
}

describe("bit-sliced flat check of every window", () => {
  // (r, N, T): radius-2 at N = 2, 3 with several step counts, and radius 1 where the cone is wide enough
  const cases: [number, number, number][] = [[2, 2, 2], [2, 2, 3], [2, 3, 3], [2, 3, 2], [1, 2, 3], [1, 3, 2], [2, 1, 1], [1, 4, 3]];
  it.each(cases)("agrees with a plain window-by-window check (r = %i, N = %i, T = %i), on random rules and on the identity, under which the check holds", (r, N, T) => {
    const random = seededRandom(1000 * r + 100 * N + T);
    let holding = 0;
    for (let trial = 0; trial < 12; trial++) {
      // every 4th rule is the identity (the output is the centre cell), under which every projection holds
      const rule = Uint8Array.from({ length: 2 ** (2 * r + 1) }, (_, i) => (trial % 4 === 0 ? (i >>> r) & 1 : random() < 0.5 ? 1 : 0));
      const p = Array.from({ length: 2 ** N }, (_, x) => (x === 0 ? 0 : random() < 0.5 ? 1 : 0));
      const expected = plainCheck(rule, r, N, T, p);
      if (expected) holding++;
      expect(slicedCheck(cone(rule, r, T), r, N, T, p)).toEqual(expected);
    }
    expect(holding).toBeGreaterThan(0);
  }, 60_000);
});
