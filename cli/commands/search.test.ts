import { describe, expect, it } from "vitest";
import { join } from "node:path";
import { runCli, tempDir } from "@/cli/shared/testSupport";
import { run } from "./search";

const TABLE_146 = join(process.cwd(), "tests/fixtures/discovery/rule-146.json");

describe("cli search", () => {
  it("search projection finds 105 → 150 at block 2 (Israeli & Goldenfeld 2004)", async () => {
    const { code, stdout } = await runCli(run, ["projection", "--rule", "105", "--block", "2", "--json"]);
    expect(code).toBe(0);
    // rule 150 = 0b10010110: bit 4a + 2b + c of the rule number is the table entry (DOMAIN.md §1)
    expect(stdout.trim().split("\n").map((l) => JSON.parse(l))).toContainEqual(
      expect.objectContaining({ target: { k: 2, r: 1, table: [0, 1, 1, 0, 1, 0, 0, 1] } }),
    );
  });

  it("search projection by table file gives the same targets as by rule number", async () => {
    const byTable = await runCli(run, ["projection", "--table", TABLE_146, "--block", "3", "--json"]);
    const byRule = await runCli(run, ["projection", "--rule", "146", "--block", "3", "--json"]);
    const targets = (s: string) => s.trim().split("\n").map((l) => [JSON.parse(l).target, JSON.parse(l).projections]);
    expect(targets(byTable.stdout)).toEqual(targets(byRule.stdout));
  });

  it("search congruence --each lists one congruence per line, coarsest first", async () => {
    const { code, stdout } = await runCli(run, ["congruence", "--rule", "204", "--block", "2", "--each", "--json"]);
    expect(code).toBe(0);
    const classes = stdout.trim().split("\n").map((l) => JSON.parse(l).classes);
    expect(classes[0]).toBe(2);
    expect([...classes].sort((a, b) => a - b)).toEqual(classes);
  });

  it("bad input exits 2 with a message", async () => {
    expect((await runCli(run, ["projection", "--block", "2"])).stderr).toMatch(/--rule or --table/);
    expect((await runCli(run, ["projection", "--rule", "999", "--block", "2"])).code).toBe(2);
    expect((await runCli(run, ["sideways", "--rule", "1"])).code).toBe(2);
    expect((await runCli(run, ["projection", "--rule", "30"])).stderr).toMatch(/--block/);
  });

  it("--steps apart from --block gives radius-2 coarse rules: rule 90 at N = 1, T = 2 onto x₋₂ XOR x₂ (DOMAIN.md §2b)", async () => {
    const { code, stdout } = await runCli(run, ["projection", "--rule", "90", "--block", "1", "--steps", "2", "--json"]);
    expect(code).toBe(0);
    const xor = Array.from({ length: 32 }, (_, i) => ((i >> 4) & 1) ^ (i & 1));
    expect(stdout.trim().split("\n").map((l) => JSON.parse(l))).toContainEqual({ target: { k: 2, r: 2, table: xor }, projections: 1, example: "01" });
  });

  it("--table takes a radius-2 rule; the same rule by --rule and --steps gives the same lines", async () => {
    const dir = tempDir();
    try {
      // the 2-step iterate of rule 90 is x₋₂ XOR x₂; at block 2 with 2 steps it behaves as rule 90 at block 2 with 4 steps
      const xor = Array.from({ length: 32 }, (_, i) => ((i >> 4) & 1) ^ (i & 1));
      const file = dir.file("xor.json", JSON.stringify({ k: 2, r: 2, table: xor }));
      const byTable = await runCli(run, ["projection", "--table", file, "--block", "2", "--steps", "2", "--json"]);
      const byRule = await runCli(run, ["projection", "--rule", "90", "--block", "2", "--steps", "4", "--json"]);
      expect(byTable.code).toBe(0);
      expect(byTable.stdout.length).toBeGreaterThan(0);
      expect(byTable.stdout).toBe(byRule.stdout);
      const congruences = await runCli(run, ["congruence", "--table", file, "--block", "2", "--steps", "2", "--json"]);
      expect(congruences.code).toBe(0);
      for (const line of congruences.stdout.trim().split("\n")) {
        const c = JSON.parse(line);
        expect(c.target.r).toBe(2);
        expect(c.target.table).toHaveLength(c.target.k ** 5);
      }
    } finally {
      dir.cleanup();
    }
  });

  it("refuses steps outside 1..2N with a message naming steps", async () => {
    const r = await runCli(run, ["projection", "--rule", "90", "--block", "2", "--steps", "5"]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/steps/);
  });
});
