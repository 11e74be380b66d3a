import { describe, expect, it } from "vitest";
import { CaInputError, checkProjection, ecaRuleOf, ecaTable } from "@/lib/ca";
import { certifyProjection } from "@/lib/certificate";
import { verifyCertificate } from "@/lib/verify";
import { searchBinaryProjections } from "./searchBinaryProjections";
import { plainProjectionCounts } from "./testSupport";

function countsOf(rule: number, block: number): Map<number, number> {
  const result = searchBinaryProjections({ rule, block });
  expect(result.stopped).toBeNull();
  return new Map(result.targets.map((t) => [t.target as number, Number(t.count)]));
}

describe("searchBinaryProjections", () => {
  it("agrees with plain enumeration of every projection for all 256 ECAs at block sizes 2 and 3", () => {
    for (const block of [2, 3])
      for (let rule = 0; rule < 256; rule++) expect([rule, block, countsOf(rule, block)]).toEqual([rule, block, plainProjectionCounts(rule, block)]);
  });

  it("agrees with plain enumeration at block size 4 for a spread of rules", () => {
    for (const rule of [90, 146]) expect([rule, countsOf(rule, 4)]).toEqual([rule, plainProjectionCounts(rule, 4)]);
  });

  it("reports examples that the core's checker certifies onto the reported target (all rules, N = 2..3)", () => {
    for (const block of [2, 3])
      for (let rule = 0; rule < 256; rule++)
        for (const t of searchBinaryProjections({ rule, block }).targets) {
          const check = checkProjection(ecaTable(rule), block, Array.from(t.example, Number));
          expect(check.ok && ecaRuleOf(check.coarse)).toBe(t.target);
        }
  });

  it("finds rule 105 → rule 150 at block 2 (Israeli & Goldenfeld, Phys. Rev. Lett. 92, 074105, 2004)", () => {
    const hit = searchBinaryProjections({ rule: 105, block: 2 }).targets.find((t) => t.target === 150);
    expect(hit).toBeDefined();
    const built = certifyProjection({ rule: 105, block: 2, projection: hit!.example });
    expect(built.ok).toBe(true);
    if (built.ok) expect(verifyCertificate(built.certificate).status).toBe("holds");
  });

  it("finds rule 146 → rule 128 at block 3 with the all-ones projection (Israeli & Goldenfeld, Phys. Rev. E 73, 026203, 2006)", () => {
    const hit = searchBinaryProjections({ rule: 146, block: 3 }).targets.find((t) => t.target === 128);
    expect(hit).toEqual({ target: 128, coarse: { k: 2, r: 1, table: [0, 0, 0, 0, 0, 0, 0, 1] }, count: 1n, example: "00000001" });
    const built = certifyProjection({ rule: 146, block: 3, projection: hit!.example });
    expect(built.ok && verifyCertificate(built.certificate).status).toBe("holds");
  });

  it("counts astronomically many projections without listing them (rule 204, the identity: every p commutes)", () => {
    // every projection of the identity's supercell commutes with the identity 204: 2^(2^N) − 2 of them
    const result = searchBinaryProjections({ rule: 204, block: 5 });
    expect(result.targets).toHaveLength(1);
    expect(result.targets[0].target).toBe(204);
    expect(result.targets[0].count).toBe(2n ** 32n - 2n);
  });

  it("searches a rule given as a table the same way as by number", () => {
    const byTable = searchBinaryProjections({ table: ecaTable(146), block: 3 });
    expect(byTable.targets).toEqual(searchBinaryProjections({ rule: 146, block: 3 }).targets);
  });

  it("records what it covered", () => {
    const { coverage } = searchBinaryProjections({ rule: 30, block: 4 });
    expect(coverage).toMatchObject({ kind: "projections", rules: [30], blocks: [4], complete: true, stopped: null });
  });

  it("stops with 'cancelled' when its signal is aborted, and with 'deadline' past its budget", () => {
    const controller = new AbortController();
    controller.abort();
    expect(searchBinaryProjections({ rule: 110, block: 5, signal: controller.signal })).toMatchObject({ stopped: "cancelled", targets: [] });
    let t = 0;
    const late = searchBinaryProjections({ rule: 0, block: 5, deadlineMs: 10, clock: () => (t += 1) });
    expect(late.stopped).toBe("deadline");
    expect(late.coverage).toMatchObject({ complete: false, blocks: [] });
  });

  it("rejects bad input with a named field", () => {
    expect(() => searchBinaryProjections({ rule: 256, block: 2 })).toThrow(CaInputError);
    expect(() => searchBinaryProjections({ rule: 30, block: 0 })).toThrow(/block/);
    expect(() => searchBinaryProjections({ block: 2 })).toThrow(/rule/);
    expect(() => searchBinaryProjections({ rule: 30, block: 2, steps: 5 })).toThrow(/steps/);
    expect(() => searchBinaryProjections({ rule: 30, block: 2, steps: 0 })).toThrow(/steps/);
  });

  it("refuses table entries that are not whole numbers instead of coercing them (\"1\", \"x\", 1.5, -1)", () => {
    const rule90 = Array.from({ length: 8 }, (_, i) => (90 >> i) & 1);
    for (const bad of ["1", "x", 1.5, -1]) {
      const table = [...rule90.slice(0, 3), bad, ...rule90.slice(4)] as number[];
      expect(() => searchBinaryProjections({ table: { k: 2, r: 1, table }, block: 2 })).toThrow(`table: entry 3 is ${JSON.stringify(bad)}`);
    }
  });
});
