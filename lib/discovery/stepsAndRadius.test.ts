/**
 * Steps apart from the block size, and sources of radius 2 (DOMAIN.md §2b), against plain enumeration over the
 * core's own supercell table (lib/ca), every result re-checked by the core's checker (checkProjection).
 */
import { describe, expect, it } from "vitest";
import { checkProjection, ecaTable, iterateTable, supercellTable, type RuleTable } from "@/lib/ca";
import { searchBinaryProjections } from "./searchBinaryProjections";
import { searchCongruences } from "./searchCongruences";
import { ecaClasses } from "./ca/ecaClasses";
import { seededRandom, setPartitions } from "./testSupport";

/** The window digits of F (its 2R+1 block states, leftmost first), computed once per table. */
function windowDigits(F: RuleTable): Int32Array {
  const width = 2 * F.r + 1;
  const digits = new Int32Array(F.table.length * width);
  for (let w = 0; w < F.table.length; w++)
    for (let i = width - 1, rest = w; i >= 0; i--, rest = Math.floor(rest / F.k)) digits[w * width + i] = rest % F.k;
  return digits;
}

const shuffled = new Map<number, Int32Array>();

/** The windows in a fixed shuffled order, so that a failing partition meets its conflict early. */
function shuffledWindows(size: number): Int32Array {
  const cached = shuffled.get(size);
  if (cached) return cached;
  const random = seededRandom(size);
  const order = Int32Array.from({ length: size }, (_, i) => i);
  for (let i = size - 1; i > 0; i--) {
    const j = Math.floor(random() * (i + 1));
    [order[i], order[j]] = [order[j], order[i]];
  }
  shuffled.set(size, order);
  return order;
}

/** Coarse table for partition p of the supercell F (k = n block states, radius R), or null when p is not a congruence. */
function plainCoarseTable(F: RuleTable, digits: Int32Array, p: readonly number[]): number[] | null {
  const width = 2 * F.r + 1;
  const m = Math.max(...p) + 1;
  const g = new Array<number>(m ** width).fill(-1);
  const order = shuffledWindows(F.table.length);
  for (const w of order) {
    let idx = 0;
    for (let i = 0; i < width; i++) idx = idx * m + p[digits[w * width + i]];
    const v = p[F.table[w]];
    if (g[idx] < 0) g[idx] = v;
    else if (g[idx] !== v) return null;
  }
  return g;
}

/** Every binary projection using both symbols, tallied by the bits of its coarse table. */
function plainProjections(F: RuleTable, digits: Int32Array): Map<string, number> {
  const n = F.k;
  const tally = new Map<string, number>();
  for (let bits = 1; bits < 2 ** n - 1; bits++) {
    const p = Array.from({ length: n }, (_, s) => Math.floor(bits / 2 ** s) % 2);
    const g = plainCoarseTable(F, digits, p);
    if (g) tally.set(g.join(""), (tally.get(g.join("")) ?? 0) + 1);
  }
  return tally;
}

/** Every proper congruence (neither one class nor all singletons), keyed by its canonical partition. */
function plainCongruences(F: RuleTable, digits: Int32Array): Map<string, number[]> {
  const found = new Map<string, number[]>();
  for (const p of setPartitions(F.k)) {
    const m = Math.max(...p) + 1;
    if (m === 1 || m === F.k) continue;
    if (plainCoarseTable(F, digits, p)) found.set(p.join(","), p);
  }
  return found;
}

/** The principal congruence of (x, y): the meet of every congruence joining them (the total one included). */
function plainPrincipal(n: number, all: number[][], x: number, y: number): string | null {
  const containing = all.filter((p) => p[x] === p[y]);
  if (containing.length === 0) return null;
  const label = new Map<string, number>();
  const meet = Array.from({ length: n }, (_, s) => {
    const key = containing.map((p) => p[s]).join(",");
    if (!label.has(key)) label.set(key, label.size);
    return label.get(key) as number;
  });
  return meet.join(",");
}

function checkAgainstPlain(t: RuleTable, source: { rule?: number; table?: RuleTable }, N: number, T: number): void {
  const F = supercellTable(t, N, T);
  const digits = windowDigits(F);
  const search = searchBinaryProjections({ ...source, block: N, steps: T });
  expect(search.stopped).toBeNull();
  const got = new Map(search.targets.map((x) => [x.coarse.table.join(""), Number(x.count)]));
  expect([N, T, got]).toEqual([N, T, plainProjections(F, digits)]);
  for (const target of search.targets) {
    expect(target.coarse.r).toBe(F.r);
    const check = checkProjection(t, N, Array.from(target.example, Number), { steps: T });
    expect(check.ok && Array.from(check.coarse.table).join("")).toBe(target.coarse.table.join(""));
  }
  const congruences = searchCongruences({ ...source, block: N, steps: T, limit: Infinity });
  expect(congruences.stopped).toBeNull();
  const plain = plainCongruences(F, digits);
  expect(congruences.exists).toBe(plain.size > 0);
  const listed = new Set(congruences.congruences.map((c) => c.partition.join(",")));
  for (const c of congruences.congruences) {
    expect(plain.has(c.partition.join(","))).toBe(true);
    expect([c.radius, c.target]).toEqual([F.r, plainCoarseTable(F, digits, c.partition)]);
    // every congruence, the checker reading the core's supercell table built once for this (rule, N, T) instead of
    // rebuilding it per call (its shape is checked by checkProjection)
    const check = checkProjection(t, N, c.partition, { steps: T, supercell: F });
    expect(check.ok && [check.coarse.r, Array.from(check.coarse.table)]).toEqual([c.radius, c.target]);
    if (c.maximal) {
      const coarser = [...plain.values()].filter((p) => p.join(",") !== c.partition.join(",") && c.partition.every((b, s) => c.partition.every((b2, s2) => b !== b2 || p[s] === p[s2])));
      expect(coarser).toEqual([]);
    }
  }
  const all = [...plain.values()];
  for (let x = 0; x < F.k; x++)
    for (let y = x + 1; y < F.k; y++) {
      const principal = plainPrincipal(F.k, all, x, y);
      if (principal) expect(listed.has(principal)).toBe(true);
    }
}

describe("searches with T steps apart from block size N", () => {
  // every (N, T) with N ≤ 3 and T ≤ 2N, split so that each part has its own generous timeout on a loaded machine
  const parts: [string, [number, number][]][] = [
    ["N ≤ 2, every T ≤ 2N", [[1, 1], [1, 2], [2, 1], [2, 2], [2, 3], [2, 4]]],
    ["N = 3, T ≤ 3", [[3, 1], [3, 2], [3, 3]]],
    ["N = 3, T = 4", [[3, 4]]],
    ["N = 3, T = 5", [[3, 5]]],
    ["N = 3, T = 6", [[3, 6]]],
  ];
  for (const [name, sizes] of parts)
    it(`agree with plain enumeration for the 88 ECA classes at ${name}, verified by the core's checker`, () => {
      for (const { representative: rule } of ecaClasses()) for (const [N, T] of sizes) checkAgainstPlain(ecaTable(rule), { rule }, N, T);
    }, 900_000);

  it("give a radius-2 coarse rule when N < T ≤ 2N: rule 90 at N = 1, T = 2 projects onto its own 2-step iterate x₋₂ XOR x₂", () => {
    // DOMAIN.md §2b: the 2-step iterate of rule 90 is x_{-2} XOR x_{2}; with N = 1 the identity projection is a coarse-graining onto it
    const xor = Array.from({ length: 32 }, (_, i) => ((i >> 4) & 1) ^ (i & 1));
    const hit = searchBinaryProjections({ rule: 90, block: 1, steps: 2 }).targets.find((t) => t.example === "01");
    expect(hit?.coarse).toEqual({ k: 2, r: 2, table: xor });
  });
});

describe("searches on radius-2 binary sources", () => {
  it("agree with plain enumeration for random radius-2 rules at N = 2, every T ≤ 4, verified by the core's checker", () => {
    const random = seededRandom(2026);
    for (let trial = 0; trial < 4; trial++) {
      const t: RuleTable = { k: 2, r: 2, table: Uint8Array.from({ length: 32 }, () => (random() < 0.5 ? 0 : 1)) };
      for (let T = 1; T <= 4; T++) checkAgainstPlain(t, { table: t }, 2, T);
    }
  }, 600_000);

  it("agree with plain enumeration of every projection for random radius-2 rules at N = 3 (T = 2, 3), verified by the core's checker", () => {
    const random = seededRandom(315);
    const rules: RuleTable[] = Array.from({ length: 4 }, () => ({ k: 2, r: 2, table: Uint8Array.from({ length: 32 }, () => (random() < 0.5 ? 0 : 1)) }));
    // and two with many projections: the identity x₀ (every projection commutes) and rule 90's 2-step iterate x₋₂ XOR x₂
    rules.push({ k: 2, r: 2, table: Uint8Array.from({ length: 32 }, (_, i) => (i >> 2) & 1) });
    rules.push({ k: 2, r: 2, table: Uint8Array.from({ length: 32 }, (_, i) => ((i >> 4) & 1) ^ (i & 1)) });
    let found = 0;
    for (const t of rules)
      for (const T of [2, 3]) {
        const F = supercellTable(t, 3, T);
        const search = searchBinaryProjections({ table: t, block: 3, steps: T });
        expect(search.stopped).toBeNull();
        const got = new Map(search.targets.map((x) => [x.coarse.table.join(""), Number(x.count)]));
        expect([T, got]).toEqual([T, plainProjections(F, windowDigits(F))]);
        for (const target of search.targets) {
          const check = checkProjection(t, 3, Array.from(target.example, Number), { steps: T });
          expect(check.ok && Array.from(check.coarse.table).join("")).toBe(target.coarse.table.join(""));
        }
        found += [...got.values()].reduce((a, b) => a + b, 0);
      }
    // the identity alone gives all 2^8 − 2 projections at both step counts
    expect(found).toBeGreaterThanOrEqual(2 * 254);
  }, 600_000);

  it("stop with 'cancelled' on a radius-2 source when the signal is aborted", () => {
    const controller = new AbortController();
    controller.abort();
    const identity = { k: 2, r: 2, table: Uint8Array.from({ length: 32 }, (_, i) => (i >> 2) & 1) };
    expect(searchBinaryProjections({ table: identity, block: 3, signal: controller.signal })).toMatchObject({ stopped: "cancelled", targets: [] });
  });

  it("search the 2-step iterate of an ECA (a radius-2 rule) like any other table", () => {
    const iterate = iterateTable(ecaTable(150), 2);
    expect(iterate.r).toBe(2);
    checkAgainstPlain(iterate, { table: iterate }, 2, 2);
  }, 120_000);
});
