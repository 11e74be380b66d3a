import { describe, expect, it } from "vitest";
import { checkProjection, ecaTable, supercellTable } from "@/lib/ca";
import { searchCongruences } from "./searchCongruences";
import { isCongruence, setPartitions } from "./testSupport";

/** Plain enumeration: every proper partition of the 2^N block states that is a congruence of the supercell. */
function plainProperCongruences(rule: number, N: number): number[][] {
  const n = 2 ** N;
  const F = supercellTable(ecaTable(rule), N).table;
  const found: number[][] = [];
  for (const partition of setPartitions(n)) {
    const m = Math.max(...partition) + 1;
    if (m > 1 && m < n && isCongruence(F, n, partition)) found.push(partition);
  }
  return found;
}

/** θ ≤ φ in the partition lattice: every class of θ lies inside a class of φ. */
function refines(theta: number[], phi: number[]): boolean {
  const image = new Map<number, number>();
  return theta.every((c, s) => {
    const seen = image.get(c);
    if (seen === undefined) image.set(c, phi[s]);
    return seen === undefined || seen === phi[s];
  });
}

describe("searchCongruences", () => {
  it("finds a proper congruence exactly when plain enumeration of all partitions does (all 256 ECAs, N = 2 and 3)", () => {
    for (const N of [2, 3])
      for (let rule = 0; rule < 256; rule++) {
        const plain = plainProperCongruences(rule, N);
        const found = searchCongruences({ rule, block: N });
        expect([rule, N, found.exists]).toEqual([rule, N, plain.length > 0]);
        const keys = new Set(plain.map((p) => p.join(",")));
        for (const c of found.congruences) {
          // every reported partition is a congruence by plain enumeration and by the core's checker
          expect(keys.has(c.partition.join(","))).toBe(true);
          const check = checkProjection(ecaTable(rule), N, c.partition);
          expect(check.ok && Array.from(check.coarse.table)).toEqual(c.target);
          // a congruence reported maximal has no proper congruence strictly above it
          if (c.maximal) expect(plain.some((p) => p.join(",") !== c.partition.join(",") && refines(c.partition, p))).toBe(false);
        }
      }
  });

  it("lists the coarsest congruences first", () => {
    const { congruences } = searchCongruences({ rule: 204, block: 3 });
    expect(congruences[0].classes).toBe(2);
    for (let i = 1; i < congruences.length; i++) expect(congruences[i].classes).toBeGreaterThanOrEqual(congruences[i - 1].classes);
  });

  it("reports no proper congruence for rule 30 at block 4 and covers that block", () => {
    const result = searchCongruences({ rule: 30, block: 4 });
    expect(result).toMatchObject({ stopped: null, exists: false, congruences: [] });
    expect(result.coverage).toMatchObject({ kind: "partitions", rules: [30], blocks: [4], complete: true });
  });

  it("stops when cancelled, without claiming a negative result", () => {
    const controller = new AbortController();
    controller.abort();
    const result = searchCongruences({ rule: 30, block: 6, signal: controller.signal });
    expect(result.stopped).toBe("cancelled");
    expect(result.exists).toBeNull();
    expect(result.coverage.complete).toBe(false);
  });

  it("rejects a block size beyond its table limit", () => {
    expect(() => searchCongruences({ rule: 30, block: 10 })).toThrow(/block/);
  });
});
