/**
 * The command lines of the discovery work, run exactly as written for people checking from outside
 * (`npm run --silent cli -- …`, each in its own process): output format, exit codes, and one-line errors naming the flag.
 */
import { spawn } from "node:child_process";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { tempDir } from "@/cli/shared/testSupport";

type Run = { code: number | null; stdout: string; stderr: string };

function cli(args: string[]): Promise<Run> {
  return new Promise((resolve, reject) => {
    const child = spawn("npm", ["run", "--silent", "cli", "--", ...args], { cwd: process.cwd(), stdio: ["ignore", "pipe", "pipe"] });
    let stdout = "";
    let stderr = "";
    child.stdout.on("data", (d) => (stdout += d));
    child.stderr.on("data", (d) => (stderr += d));
    child.on("error", reject);
    child.on("close", (code) => resolve({ code, stdout, stderr }));
  });
}

const lines = (text: string) => text.trim().split("\n").filter(Boolean).map((l) => JSON.parse(l) as Record<string, unknown>);

// Rule 150 = 0b10010110: bit 4a + 2b + c of the rule number is the table entry (DOMAIN.md §1).
const RULE_150 = [0, 1, 1, 0, 1, 0, 0, 1];
// The 2-step iterate of rule 90, x₋₂ XOR x₂ (DOMAIN.md §2b), and its complement.
const XOR_2 = Array.from({ length: 32 }, (_, i) => ((i >> 4) & 1) ^ (i & 1));
// Hand-worked chain for exact lumpability (lib/markov/checkExactLumping.test.ts; Buchholz 1994).
const HAND = "1/2,1/4,1/4\n1/3,1/3,1/3\n1/6,5/12,5/12\n";

let dir: ReturnType<typeof tempDir>;
const files: Record<string, string> = {};

beforeAll(() => {
  dir = tempDir();
  files.xor = dir.file("xor2.json", JSON.stringify({ k: 2, r: 2, table: XOR_2 }));
  files.shift3 = dir.file("shift3.json", JSON.stringify({ k: 3, r: 1, table: Array.from({ length: 27 }, (_, i) => i % 3) }));
  files.strings = dir.file("strings.json", JSON.stringify({ k: 2, r: 2, table: XOR_2.map(String) }));
  files.hand = dir.file("hand.csv", HAND);
  files.unstochastic = dir.file("bad.mtx", "%%MatrixMarket matrix coordinate real general\n2 2 3\n1 1 0.5\n1 2 0.6\n2 2 1\n");
});

afterAll(() => dir.cleanup());

describe("search projection / congruence --json: one line per coarse rule, {target, projections, example}", () => {
  it("rule 105 at N = T = 2 onto rule 150 (Israeli & Goldenfeld, PRL 92, 074105, 2004): 6 projections, 3 partitions", { timeout: 120_000 }, async () => {
    const [projection, congruence] = await Promise.all([
      cli(["search", "projection", "--rule", "105", "--block", "2", "--steps", "2", "--json"]),
      cli(["search", "congruence", "--rule", "105", "--block", "2", "--steps", "2", "--json"]),
    ]);
    // 105 twice is x₋₂ XOR x₀ XOR x₂ (by hand), so the first cell, the second, their XOR and the three complements commute
    expect([projection.code, lines(projection.stdout)]).toEqual([0, [{ target: { k: 2, r: 1, table: RULE_150 }, projections: 6, example: "0011" }]]);
    // as partitions (a projection and its complement are one partition): {00,01 | 10,11}, {00,10 | 01,11}, {00,11 | 01,10}
    expect([congruence.code, lines(congruence.stdout)]).toEqual([0, [{ target: { k: 2, r: 1, table: RULE_150 }, projections: 3, example: "0011" }]]);
  });

  it("--table FILE with {k: 2, r: 2}: x₋₂ XOR x₂ at N = 1 projects onto itself and, complemented, onto its complement", { timeout: 120_000 }, async () => {
    const run = await cli(["search", "projection", "--table", files.xor, "--block", "1", "--json"]);
    expect(run.code).toBe(0);
    expect(lines(run.stdout)).toEqual([
      { target: { k: 2, r: 2, table: XOR_2 }, projections: 1, example: "01" },
      { target: { k: 2, r: 2, table: XOR_2.map((v) => 1 - v) }, projections: 1, example: "10" },
    ]);
  });

  it("congruence on a three-state table: the shift commutes with every map, so all 3 two-class partitions of {0,1,2} give the binary shift", { timeout: 120_000 }, async () => {
    const run = await cli(["search", "congruence", "--table", files.shift3, "--block", "1", "--json"]);
    // rule 170 (copy the right neighbour, DOMAIN.md §1) as a table: entry = c
    expect([run.code, lines(run.stdout)]).toEqual([0, [{ target: { k: 2, r: 1, table: [0, 1, 0, 1, 0, 1, 0, 1] }, projections: 3, example: "001" }]]);
  });
});

describe("atlas --partitions --max-block 9 --json", () => {
  it("accepts block 9 and starts (stopped here by a deadline, exit 1), and refuses 10 naming --max-block", { timeout: 120_000 }, async () => {
    const [nine, ten] = await Promise.all([
      cli(["atlas", "--partitions", "--max-block", "9", "--json", "--deadline-ms", "1500"]),
      cli(["atlas", "--partitions", "--max-block", "10", "--json"]),
    ]);
    expect(nine.code).toBe(1);
    expect(nine.stderr).toMatch(/^stopped \(deadline\)/);
    expect([ten.code, ten.stderr]).toEqual([2, "error: --max-block: max block must be an integer from 2 to 9 for partitions, got 10\n"]);
  });
});

describe("certify lumping --exact and lump --exact", () => {
  it("exit 0 with the certificate, exit 1 with the counterexample; the coarsest exact lumping and every exact lumping of the hand-worked chain", { timeout: 120_000 }, async () => {
    const [holds, fails, coarsest, all] = await Promise.all([
      cli(["certify", "lumping", "--exact", "--matrix", files.hand, "--partition", "0,1,1"]),
      cli(["certify", "lumping", "--exact", "--matrix", files.hand, "--partition", "0,0,1"]),
      cli(["lump", files.hand, "--exact", "--labels", "a,b,b", "--json"]),
      cli(["lump", files.hand, "--exact", "--all", "--json"]),
    ]);
    expect(holds.code).toBe(0);
    expect(JSON.parse(holds.stdout).target.matrix).toEqual([["1/2", "1/2"], ["1/4", "3/4"]]);
    expect(fails.code).toBe(1);
    // from block {0, 1} into state 0: 1/2 + 1/3 = 5/6, into state 1: 1/4 + 1/3 = 7/12
    expect(JSON.parse(fails.stdout).counterexample).toEqual({ kind: "not-exactly-lumpable", block: 0, targetBlock: 0, states: [0, 1], sums: ["5/6", "7/12"] });
    expect([coarsest.code, lines(coarsest.stdout)]).toEqual([0, [{ partition: [0, 1, 1], blocks: 2, lumped: [["1/2", "1/2"], ["1/4", "3/4"]] }]]);
    // by hand: the chain is doubly stochastic (one block); {0,2}|{1}: into states 0 and 2 from {0,2}, 1/2 + 1/6 = 1/4 + 5/12 = 2/3,
    // from {1}, 1/3 = 1/3; {0,1}|{2} fails as above. --all used to ignore --exact and list the strong lumpings.
    expect([all.code, lines(all.stdout).map((l) => l.partition)]).toEqual([0, [[0, 0, 0], [0, 1, 0], [0, 1, 1], [0, 1, 2]]]);
  });
});

describe("bad input: one line on stderr naming the flag, exit 2, no stack trace", () => {
  it("for each command", { timeout: 300_000 }, async () => {
    const cases: [string[], RegExp][] = [
      [["search", "projection", "--rule", "105", "--block", "-1"], /^error: --block: "-1" is not a valid value/],
      [["search", "projection", "--rule", "105", "--block", "2", "--steps", "5"], /^error: --steps: steps must be an integer from 1 to 2N = 4, got 5$/],
      [["search", "projection", "--block", "2"], /^error: --rule or --table is required \(--help prints the usage\)$/],
      [["search", "projection", "--table", "STRINGS", "--block", "2"], /^error: --table \S+strings\.json: table: entry 0 is "0", not a symbol/],
      [["search", "congruence", "--rule", "105", "--block", "2", "--each", "--limit", "0"], /^error: --limit must be at least 1, got 0$/],
      [["certify", "lumping", "--exact", "--matrix", "HAND", "--partition", "0,1"], /^error: --partition: has 2 entries for a 3-state chain$/],
      [["certify", "lumping", "--exact", "--matrix", "HAND", "--partition", "0,1,1", "--steps", "0"], /^error: --steps: /],
      [["lump", "BAD", "--exact", "--json"], /^error: \S+bad\.mtx: row 1 sums to 11\/10, not 1$/],
    ];
    const swap = (a: string) => ({ STRINGS: files.strings, HAND: files.hand, BAD: files.unstochastic })[a] ?? a;
    const runs = [];
    for (let i = 0; i < cases.length; i += 2) runs.push(...(await Promise.all(cases.slice(i, i + 2).map(([args]) => cli(args.map(swap))))));
    for (const [i, run] of runs.entries()) {
      expect([cases[i][0].join(" "), run.code, run.stdout]).toEqual([cases[i][0].join(" "), 2, ""]);
      expect(run.stderr.trimEnd().split("\n")).toHaveLength(1);
      expect(run.stderr.trimEnd()).toMatch(cases[i][1]);
    }
  });
});
