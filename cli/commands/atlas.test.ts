import { describe, expect, it } from "vitest";
import { checkProjection, ecaRuleOf, ecaTable } from "@/lib/ca";
import { runCli } from "@/cli/shared/testSupport";
import { run } from "./atlas";

describe("cli atlas", () => {
  it("prints one JSON line per (rule, block, target) with exactly the specified keys, including 146 → 128 at N = 3", async () => {
    const { code, stdout } = await runCli(run, ["--max-block", "3", "--json"]);
    expect(code).toBe(0);
    const lines = stdout.trim().split("\n");
    expect(lines).toContain('{"rule":146,"block":3,"target":128,"projections":1,"example":"00000001"}');
    for (const line of lines) {
      const row = JSON.parse(line);
      expect(Object.keys(row)).toEqual(["rule", "block", "target", "projections", "example"]);
      const check = checkProjection(ecaTable(row.rule), row.block, Array.from(row.example as string, Number));
      expect(check.ok && ecaRuleOf(check.coarse)).toBe(row.target);
    }
  });

  it("--partitions prints one line per rule with the smallest block or null", async () => {
    const { code, stdout } = await runCli(run, ["--partitions", "--max-block", "3", "--json"]);
    expect(code).toBe(0);
    const rows = stdout.trim().split("\n").map((l) => JSON.parse(l));
    expect(rows.map((r) => r.rule)).toEqual(Array.from({ length: 256 }, (_, i) => i));
    for (const row of rows) {
      expect(Object.keys(row)).toEqual(["rule", "block", "classes", "partition", "target"]);
      if (row.block === null) continue;
      const check = checkProjection(ecaTable(row.rule), row.block, row.partition);
      expect(check.ok && Array.from(check.coarse.table)).toEqual(row.target);
    }
    expect(rows.find((r) => r.rule === 30).block).toBeNull();
  });

  it("text mode ends with the smallest-block headline", async () => {
    const { stdout } = await runCli(run, ["--partitions", "--max-block", "3"]);
    expect(stdout.trim().split("\n").at(-1)).toMatch(/^smallest block with a proper coarse-graining: \d+ at N=2, \d+ at N=3; \d+ rules \(\d+ symmetry classes: .*\) have none up to N=3$/);
  });

  it("stops at its deadline with exit 1 and says what it covered", async () => {
    const { code, stderr } = await runCli(run, ["--max-block", "5", "--json", "--deadline-ms", "1"]);
    expect(code).toBe(1);
    expect(stderr).toMatch(/stopped \(deadline\)/);
  });

  it("refuses a missing or out-of-range --max-block with exit 2", async () => {
    expect((await runCli(run, [])).code).toBe(2);
    const far = await runCli(run, ["--max-block", "12"]);
    expect(far.code).toBe(2);
    expect(far.stderr).toMatch(/max block/);
    expect((await runCli(run, ["--max-block", "x"])).stderr).toMatch(/--max-block/);
  });
});
