import { describe, expect, it } from "vitest";
import { checkProjection, ecaTable, supercellTable, type RuleTable } from "@/lib/ca";
import { searchAllCongruences } from "./searchAllCongruences";
import { isCongruence, seededRandom, setPartitions } from "./testSupport";

/** Plain: every proper set partition of the block states that is a congruence, and which of them are maximal. */
function plainAll(t: RuleTable, N: number): { all: string[]; maximal: string[] } {
  const F = supercellTable(t, N).table;
  const n = t.k ** N;
  const all: number[][] = [];
  for (const p of setPartitions(n)) {
    const m = Math.max(...p) + 1;
    if (m > 1 && m < n && isCongruence(F, n, p)) all.push(p);
  }
  // p ≤ q when every class of p lies inside a class of q
  const below = (p: number[], q: number[]) => p.every((b, s) => p.every((b2, s2) => b !== b2 || q[s] === q[s2]));
  const maximal = all.filter((p) => !all.some((q) => q.join(",") !== p.join(",") && below(p, q)));
  return { all: all.map((p) => p.join(",")).sort(), maximal: maximal.map((p) => p.join(",")).sort() };
}

function check(t: RuleTable, N: number): number {
  const found = searchAllCongruences({ table: t, block: N });
  expect(found.stopped).toBeNull();
  const plain = plainAll(t, N);
  expect(found.congruences.map((c) => c.partition.join(",")).sort()).toEqual(plain.all);
  expect(found.congruences.filter((c) => c.maximal).map((c) => c.partition.join(",")).sort()).toEqual(plain.maximal);
  for (const c of found.congruences) {
    const verdict = checkProjection(t, N, c.partition);
    expect(verdict.ok && Array.from(verdict.coarse.table)).toEqual(c.target);
  }
  return found.congruences.length;
}

describe("searchAllCongruences", () => {
  it("lists exactly the congruences (and the maximal ones) that plain enumeration of all 4,140 partitions finds, ECAs at N = 3", () => {
    let total = 0;
    for (const rule of [4, 90, 128, 150, 30, 146, 12]) total += check(ecaTable(rule), 3);
    expect(total).toBeGreaterThan(10);
  }, 300_000);

  it("lists exactly what plain enumeration of all 21,147 partitions of the nine block states finds, random three-state rules at N = 2", () => {
    const random = seededRandom(15);
    let total = 0;
    for (let trial = 0; trial < 4; trial++) {
      const table = Uint8Array.from({ length: 27 }, () => Math.floor(random() * 3));
      // half of them made to respect merging symbols 1 and 2, so that proper congruences exist
      if (trial % 2 === 1) for (let i = 0; i < 27; i++) table[i] = table[i] === 2 ? 1 : table[i];
      total += check({ k: 3, r: 1, table }, 2);
    }
    expect(total).toBeGreaterThan(0);
  }, 300_000);
});
