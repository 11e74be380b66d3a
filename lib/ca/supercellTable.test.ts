import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { ecaTable, evolveCells, fromDigits, iterateTable, supercellShape, supercellTable, supercellTablePlain, toDigits, type RuleTable } from "./index";
import { centreAfter } from "./testSupport";
import { supercellTableStaged } from "./supercellTableStaged";

const sameTable = (a: RuleTable, b: RuleTable) => a.k === b.k && a.r === b.r && a.table.every((v, i) => v === b.table[i]);

/** Compares every entry when the table is small, else a random sample, with the plain definition. */
function agreesWithPlain(t: RuleTable, N: number, T: number): boolean {
  const fast = supercellTable(t, N, T);
  if (fast.table.length <= 2 ** 16) return sameTable(fast, supercellTablePlain(t, N, T));
  const W = (2 * fast.r + 1) * N;
  const offset = fast.r * N - t.r * T;
  return fc.sample(fc.integer({ min: 0, max: fast.table.length - 1 }), 3000).every((w) => {
    const row = evolveCells(t, toDigits(w, t.k, W), T);
    return fast.table[w] === fromDigits(row, t.k, offset, offset + N);
  });
}

describe("supercellTable (light-cone composition) against the plain definition", () => {
  it("agrees with the plain table for several ECAs, blocks 1..8 and various step counts", () => {
    for (const rule of [30, 90, 105, 110, 146, 184])
      for (const N of [1, 2, 3, 4, 5, 6, 7, 8])
        for (const T of [1, N, N + 1, 2 * N + 1]) {
          if ((2 * Math.ceil(T / N) + 1) * N > 24 || (N >= 7 && rule !== 110)) continue;
          expect(agreesWithPlain(ecaTable(rule), N, T), `rule ${rule} N=${N} T=${T}`).toBe(true);
        }
  });

  it("agrees with the plain table on every window at block 6, where the segment tables are used", () => {
    expect(sameTable(supercellTable(ecaTable(110), 6), supercellTablePlain(ecaTable(110), 6))).toBe(true);
  });

  it("agrees with the plain table at block 8 on a sample of windows, checked by string evolution", () => {
    const F = supercellTable(ecaTable(110), 8);
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 2 ** 24 - 1 }), (w) => {
        const bits = w.toString(2).padStart(24, "0");
        const blocks = [bits.slice(0, 8), bits.slice(8, 16), bits.slice(16)];
        return F.table[w] === parseInt(centreAfter(110, blocks, 8), 2);
      }),
      { numRuns: 2000 },
    );
  });

  it("agrees with the plain table for random radius-2 binary rules and random 3-symbol rules", () => {
    fc.assert(
      fc.property(fc.uint8Array({ min: 0, max: 1, minLength: 32, maxLength: 32 }), fc.integer({ min: 1, max: 4 }), (table, N) =>
        agreesWithPlain({ k: 2, r: 2, table }, N, N),
      ),
      { numRuns: 12 },
    );
    fc.assert(
      fc.property(fc.uint8Array({ min: 0, max: 2, minLength: 27, maxLength: 27 }), fc.integer({ min: 1, max: 2 }), (table, N) =>
        agreesWithPlain({ k: 3, r: 1, table }, N, N),
      ),
      { numRuns: 12 },
    );
  });

  it("agrees with the plain table for 3- and 4-symbol rules large enough for the base-k segment tables", () => {
    fc.assert(
      fc.property(fc.uint8Array({ min: 0, max: 2, minLength: 27, maxLength: 27 }), fc.constantFrom(3, 4), (table, N) =>
        sameTable(supercellTable({ k: 3, r: 1, table }, N), supercellTablePlain({ k: 3, r: 1, table }, N)),
      ),
      { numRuns: 4 },
    );
    fc.assert(
      fc.property(fc.uint8Array({ min: 0, max: 3, minLength: 64, maxLength: 64 }), (table) =>
        sameTable(supercellTable({ k: 4, r: 1, table }, 3), supercellTablePlain({ k: 4, r: 1, table }, 3)),
      ),
      { numRuns: 3 },
    );
  });

  it("builds binary tables the same way by base-k arithmetic as by bit shifts", () => {
    const t = ecaTable(54);
    const { K, R, W, size } = supercellShape(t, 6, 5);
    expect(sameTable(supercellTableStaged(t, 6, 5, K, R, W, size)!, supercellTable(t, 6, 5))).toBe(true);
  });

  it("encodes the block with the leftmost cell most significant: rule 204 (identity) maps each window to its centre", () => {
    const F = supercellTable(ecaTable(204), 3);
    for (let w = 0; w < 512; w++) expect(F.table[w]).toBe((w >> 3) & 7);
  });

  it("refuses a supercell alphabet beyond 256 symbols", () => {
    expect(() => supercellTable(ecaTable(30), 9)).toThrow(/exceeds 256/);
  });

  it("does not mutate the rule table", () => {
    const t = ecaTable(30);
    const before = Array.from(t.table);
    supercellTable(t, 5);
    expect(Array.from(t.table)).toEqual(before);
  });
});

describe("iterateTable (CA time decimation, DOMAIN.md §2)", () => {
  it("has radius rT and equals T plain steps on every window", () => {
    for (const rule of [30, 110, 45])
      for (const T of [1, 2, 3, 5]) {
        const f = iterateTable(ecaTable(rule), T);
        expect(f.r).toBe(T);
        for (let w = 0; w < f.table.length; w++) expect(f.table[w]).toBe(evolveCells(ecaTable(rule), toDigits(w, 2, 2 * T + 1), T)[0]);
      }
  });

  it("turns rule 90 applied twice into x(i-2) xor x(i+2) (common practice: rule 90 is additive)", () => {
    const f = iterateTable(ecaTable(90), 2);
    for (let w = 0; w < 32; w++) expect(f.table[w]).toBe(((w >> 4) & 1) ^ (w & 1));
  });
});
