import { describe, expect, it } from "vitest";
import { checkProjection, CaInputError, supercellTable } from "@/lib/ca";
import { buildTotalisticAtlas, totalisticTable, TOTALISTIC_CODES } from "./totalisticAtlas";
import { isCongruence, setPartitions } from "./testSupport";

describe("totalisticTable (DOMAIN.md §2b numbering)", () => {
  it("reads the value for sum s as base-3 digit s of the code: a hand-worked example, code 1461", () => {
    // 1461 = 1·3^1 + 2·3^6: sum 1 → 1, sum 6 → 2, every other sum → 0
    const t = totalisticTable(1461).table;
    expect(t).toHaveLength(27);
    // neighbourhood (a, b, c) sits at index 9a + 3b + c (DOMAIN.md §1)
    expect([t[1], t[3], t[9]]).toEqual([1, 1, 1]); // 001, 010, 100: sum 1
    expect(t[26]).toBe(2); // 222: sum 6
    expect([t[0], t[4], t[13], t[25]]).toEqual([0, 0, 0, 0]); // sums 0, 2, 3, 5
    expect(Array.from(t).filter((v) => v === 1)).toHaveLength(3);
    expect(Array.from(t).filter((v) => v === 2)).toHaveLength(1);
  });

  it("has 2,187 codes and refuses others with a named field", () => {
    expect(TOTALISTIC_CODES).toBe(2187);
    expect(Array.from(totalisticTable(2186).table).every((v) => v === 2)).toBe(true);
    expect(() => totalisticTable(2187)).toThrow(CaInputError);
    expect(() => totalisticTable(-1)).toThrow(/code/);
  });
});

/** Plain: the two-class partitions of {0, 1, 2} that are congruences of the 27-entry table. */
function plainBlockOne(table: Uint8Array): string[] {
  const found: string[] = [];
  for (const p of [
    [0, 0, 1],
    [0, 1, 0],
    [0, 1, 1],
  ]) {
    const g = new Map<number, number>();
    let ok = true;
    for (let a = 0; a < 3 && ok; a++)
      for (let b = 0; b < 3 && ok; b++)
        for (let c = 0; c < 3 && ok; c++) {
          const key = p[a] * 4 + p[b] * 2 + p[c];
          const v = p[table[a * 9 + b * 3 + c]];
          if (!g.has(key)) g.set(key, v);
          else if (g.get(key) !== v) ok = false;
        }
    if (ok) found.push(p.join(","));
  }
  return found;
}

describe("buildTotalisticAtlas", () => {
  it("at N = 1 finds exactly the congruences plain enumeration finds, for all 2,187 codes, each verified by the core's checker", () => {
    const atlas = buildTotalisticAtlas({ blocks: [1] });
    expect(atlas.stopped).toBeNull();
    const byCode = new Map(atlas.rows.map((r) => [r.code, r.congruences]));
    let withOne = 0;
    for (let code = 0; code < TOTALISTIC_CODES; code++) {
      const table = totalisticTable(code).table;
      const expected = plainBlockOne(table).sort();
      const got = (byCode.get(code) ?? []).map((c) => c.partition.join(",")).sort();
      expect([code, got]).toEqual([code, expected]);
      if (expected.length > 0) withOne++;
      for (const c of byCode.get(code) ?? []) {
        const check = checkProjection(totalisticTable(code), 1, c.partition);
        expect(check.ok && Array.from(check.coarse.table)).toEqual(c.target);
      }
    }
    expect(withOne).toBeGreaterThan(0);
  }, 300_000);

  it("at N = 2 lists every proper congruence that plain enumeration of all 21,147 partitions finds, each verified by the core's checker (a sample of codes)", () => {
    // code 0 (every cell becomes 0) makes every one of the 21,145 proper partitions a congruence
    const codes = [0, 1, 1461, 777, 1000];
    const atlas = buildTotalisticAtlas({ blocks: [2], codes });
    const byCode = new Map(atlas.rows.map((r) => [r.code, r.congruences]));
    expect(byCode.get(0)).toHaveLength(21145);
    let listed = 0;
    for (const code of codes) {
      const table = totalisticTable(code);
      const F = supercellTable(table, 2).table;
      const expected: string[] = [];
      for (const p of setPartitions(9)) {
        const m = Math.max(...p) + 1;
        if (m > 1 && m < 9 && isCongruence(F, 9, p)) expected.push(p.join(","));
      }
      const got = byCode.get(code) ?? [];
      expect([code, got.map((c) => c.partition.join(",")).sort()]).toEqual([code, expected.sort()]);
      // the checker rebuilds its supercell table per call: all of them, but a hundred spread over code 0's 21,145
      for (const [i, c] of got.entries()) {
        if (got.length > 1000 && i % 211 !== 0) continue;
        const check = checkProjection(table, 2, c.partition);
        expect(check.ok && Array.from(check.coarse.table)).toEqual(c.target);
      }
      listed += got.length;
    }
    expect(listed).toBeGreaterThan(21145);
  }, 300_000);

  it("stops when cancelled and covers no block size", () => {
    const controller = new AbortController();
    controller.abort();
    expect(buildTotalisticAtlas({ signal: controller.signal })).toMatchObject({ stopped: "cancelled", blocks: [] });
  });
});
