import { describe, expect, it } from "vitest";
import { join } from "node:path";
import { runCli } from "@/cli/shared/testSupport";
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

  it("search congruence lists coarsest first", async () => {
    const { code, stdout } = await runCli(run, ["congruence", "--rule", "204", "--block", "2", "--json"]);
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
});
