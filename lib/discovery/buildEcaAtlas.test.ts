import { describe, expect, it } from "vitest";
import { checkProjection, ecaRuleOf, ecaTable } from "@/lib/ca";
import { certifyProjection } from "@/lib/certificate";
import { verifyCertificate } from "@/lib/verify";
import { buildEcaAtlas, type PartitionAtlasRow } from "./buildEcaAtlas";
import { plainProjectionCounts } from "./testSupport";

function noneSet(rows: PartitionAtlasRow[]): { rules: number[]; classes: number[] } {
  const none = rows.filter((r) => r.block === null);
  return { rules: none.map((r) => r.rule), classes: [...new Set(none.map((r) => r.symmetryClass))].sort((a, b) => a - b) };
}

describe("buildEcaAtlas", () => {
  it("projections: every row of blocks 2..3 matches plain enumeration and is certified by the core's checker", () => {
    const atlas = buildEcaAtlas({ kind: "projections", maxBlock: 3 });
    if (atlas.kind !== "projections") throw new Error("kind");
    expect(atlas.stopped).toBeNull();
    for (const N of [2, 3])
      for (let rule = 0; rule < 256; rule++) {
        const rows = atlas.rows.filter((r) => r.rule === rule && r.block === N);
        expect([rule, N, new Map(rows.map((r) => [r.target, Number(r.count)]))]).toEqual([rule, N, plainProjectionCounts(rule, N)]);
        for (const r of rows) {
          const check = checkProjection(ecaTable(rule), N, Array.from(r.example, Number));
          expect(check.ok && ecaRuleOf(check.coarse)).toBe(r.target);
        }
      }
    expect(new Set(atlas.rows.map((r) => r.symmetryClass)).size).toBeLessThanOrEqual(88);
    expect(atlas.coverage).toMatchObject({ kind: "projections", blocks: [2, 3], complete: true });
  });

  it("projections at block 4: certificates for every row verify (sampled every 7th row)", () => {
    const atlas = buildEcaAtlas({ kind: "projections", minBlock: 4, maxBlock: 4 });
    if (atlas.kind !== "projections") throw new Error("kind");
    atlas.rows.forEach((r, i) => {
      if (i % 7 !== 0) return;
      const built = certifyProjection({ rule: r.rule, block: 4, projection: r.example });
      expect(built.ok && verifyCertificate(built.certificate).status).toBe("holds");
    });
  });

  it(
    "partitions: at N = 7 the rules with no proper coarse-graining are four inequivalent rules, the same set as at " +
      "N = 6 (stabilised) — reproducing Dzwinel & Magiera, J. Comput. Sci. (2015)",
    () => {
      const six = buildEcaAtlas({ kind: "partitions", maxBlock: 6 });
      const seven = buildEcaAtlas({ kind: "partitions", maxBlock: 7 });
      if (six.kind !== "partitions" || seven.kind !== "partitions") throw new Error("kind");
      expect(noneSet(seven.rows).classes).toHaveLength(4);
      // The published four, by class representative: rules 30, 45, 106 and 154 with their reflections and
      // complements (as Israeli & Goldenfeld, PRE 73, 026203, 2006, also report; rule list recalled from memory).
      expect(noneSet(seven.rows).classes).toEqual([30, 45, 106, 154]);
      expect(noneSet(seven.rows).rules).toEqual([30, 45, 75, 86, 89, 101, 106, 120, 135, 149, 154, 166, 169, 180, 210, 225]);
      expect(noneSet(seven.rows)).toEqual(noneSet(six.rows));
      // every class has the same smallest block for all its members, and every reported congruence is certified
      for (const row of seven.rows) {
        if (row.block === null) continue;
        const check = checkProjection(ecaTable(row.rule), row.block, row.partition!);
        expect(check.ok && Array.from(check.coarse.table)).toEqual(row.target);
      }
      expect(seven.coverage).toMatchObject({ kind: "partitions", blocks: [2, 3, 4, 5, 6, 7], complete: true });
    },
    120_000,
  );

  it("partitions: members of a symmetry class share their smallest block size", () => {
    const atlas = buildEcaAtlas({ kind: "partitions", maxBlock: 4 });
    const byClass = new Map<number, Set<number | null>>();
    for (const row of atlas.rows as PartitionAtlasRow[]) byClass.set(row.symmetryClass, (byClass.get(row.symmetryClass) ?? new Set()).add(row.block));
    expect(byClass.size).toBe(88);
    for (const blocks of byClass.values()) expect(blocks.size).toBe(1);
  });

  it("stops when cancelled and says which blocks it covered", () => {
    const controller = new AbortController();
    controller.abort();
    const atlas = buildEcaAtlas({ kind: "projections", maxBlock: 4, signal: controller.signal });
    expect(atlas.stopped).toBe("cancelled");
    expect(atlas.coverage).toMatchObject({ complete: false, blocks: [] });
  });

  it("reports progress from 0 to 1", () => {
    const seen: number[] = [];
    buildEcaAtlas({ kind: "partitions", maxBlock: 3, onProgress: (f) => seen.push(f) });
    expect(seen[0]).toBe(0);
    expect(seen.at(-1)).toBe(1);
    expect(seen.every((f, i) => i === 0 || f >= seen[i - 1])).toBe(true);
  });

  it("rejects a max block out of range", () => {
    expect(() => buildEcaAtlas({ kind: "projections", maxBlock: 8 })).toThrow(/max block/);
    expect(() => buildEcaAtlas({ kind: "partitions", maxBlock: 1 })).toThrow(/max block/);
  });
});
