import { describe, expect, it } from "vitest";
import { checkProjection, ecaRuleOf, supercellTable, type RuleTable } from "@/lib/ca";
import { searchBinaryProjections } from "./searchBinaryProjections";
import { searchCongruences } from "./searchCongruences";
import { isCongruence, seededRandom, setPartitions } from "./testSupport";

/** Random radius-1 tables on three symbols; a few are built to have structure (symbol 2 behaves like symbol 1). */
function tables(): RuleTable[] {
  const random = seededRandom(7);
  const out: RuleTable[] = [];
  for (let t = 0; t < 6; t++) {
    const table = Uint8Array.from({ length: 27 }, () => Math.floor(random() * 3));
    if (t % 2 === 1)
      for (let i = 0; i < 27; i++) {
        // merge symbols 1 and 2: the value depends on the neighbourhood only through "is it 0", then lift back
        const digits = [Math.floor(i / 9), Math.floor(i / 3) % 3, i % 3].map((d) => (d === 2 ? 1 : d));
        table[i] = table[digits[0] * 9 + digits[1] * 3 + digits[2]] === 0 ? 0 : 1 + (i % 2);
      }
    out.push({ k: 3, r: 1, table });
  }
  return out;
}

describe("searches on general (k = 3) rule tables", () => {
  it("find a proper congruence at block 2 exactly when plain enumeration of all partitions does, each certified by the core", () => {
    let existing = 0;
    for (const t of tables()) {
      const F = supercellTable(t, 2).table;
      let plain = false;
      for (const p of setPartitions(9)) {
        const m = Math.max(...p) + 1;
        if (m > 1 && m < 9 && isCongruence(F, 9, p)) {
          plain = true;
          break;
        }
      }
      const found = searchCongruences({ table: t, block: 2 });
      expect(found.exists).toBe(plain);
      if (plain) existing++;
      for (const c of found.congruences) {
        const check = checkProjection(t, 2, c.partition);
        expect(check.ok && Array.from(check.coarse.table)).toEqual(c.target);
      }
    }
    expect(existing).toBeGreaterThan(0);
  });

  it("count binary projections at block 2 like plain enumeration of all 2^9 projections", () => {
    let seen = 0;
    for (const t of tables()) {
      const plain = new Map<number, number>();
      for (let p = 1; p < 511; p++) {
        const proj = Array.from({ length: 9 }, (_, s) => (p >> s) & 1);
        const check = checkProjection(t, 2, proj);
        if (check.ok) {
          const target = ecaRuleOf(check.coarse) as number;
          plain.set(target, (plain.get(target) ?? 0) + 1);
        }
      }
      const found = searchBinaryProjections({ table: t, block: 2 });
      expect(new Map(found.targets.map((x) => [x.target, Number(x.count)]))).toEqual(plain);
      seen += found.targets.length;
    }
    expect(seen).toBeGreaterThan(0);
  });
});
