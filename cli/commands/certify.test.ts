import { describe, expect, it } from "vitest";
import { join } from "node:path";
import { run } from "./certify";
import { FIXTURES, runCli, tempDir } from "@/cli/shared/testSupport";

describe("cli certify", () => {
  it("prints the certificate for rule 105 → 150 at block 2 by parity (Israeli & Goldenfeld 2004) and exits 0", async () => {
    const r = await runCli(run, ["projection", "--rule", "105", "--block", "2", "--projection", "0110"]);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout)).toMatchObject({ source: { kind: "eca", rule: 105 }, target: { kind: "eca", rule: 150 }, address: expect.stringMatching(/^sha256:/) });
  });

  it("prints the counterexample as JSON and exits 1 when the square does not commute", async () => {
    const r = await runCli(run, ["projection", "--rule", "30", "--block", "2", "--projection", "0110"]);
    expect(r.code).toBe(1);
    expect(JSON.parse(r.stdout)).toMatchObject({ status: "fails", counterexample: { kind: "not-a-function" } });
  });

  it("lumps the weather chain (Grinstead & Snell Example 11.1) read from CSV and from Matrix Market alike", async () => {
    const outputs = [];
    for (const file of ["weather.csv", "weather.mtx"]) {
      const r = await runCli(run, ["lumping", "--matrix", join(FIXTURES, file), "--labels", "R,N,S", "--partition", "0,1,0"]);
      expect(r.code).toBe(0);
      outputs.push(r.stdout);
    }
    expect(outputs[0]).toBe(outputs[1]);
    expect(JSON.parse(outputs[0]).target.matrix).toEqual([["3/4", "1/4"], ["1", "0"]]);
    const refused = await runCli(run, ["lumping", "--matrix", join(FIXTURES, "weather.csv"), "--partition", "0,0,1"]);
    expect(refused.code).toBe(1);
    expect(JSON.parse(refused.stdout).counterexample).toEqual({ kind: "not-lumpable", block: 0, states: [0, 1], targetBlock: 0, sums: ["3/4", "1/2"] });
  });

  it("certifies decimation, blocking and iterate", async () => {
    expect((await runCli(run, ["decimation", "--matrix", join(FIXTURES, "weather.csv"), "--steps", "2"])).code).toBe(0);
    expect((await runCli(run, ["blocking", "--rule", "110", "--block", "3"])).code).toBe(0);
    expect((await runCli(run, ["iterate", "--rule", "110", "--steps", "2"])).code).toBe(0);
  });

  it("reads a general rule table from a JSON file", async () => {
    const dir = tempDir();
    try {
      const file = dir.file("rule.json", JSON.stringify({ k: 2, r: 1, table: [1, 0, 0, 1, 0, 1, 1, 0] }));
      const r = await runCli(run, ["projection", "--table", file, "--block", "2", "--projection", "0110"]);
      expect(r.code).toBe(0);
      expect(JSON.parse(r.stdout).source).toEqual({ kind: "eca", rule: 105 });
    } finally {
      dir.cleanup();
    }
  });

  it("exits 2 with a message naming the problem for bad input, without a stack trace", async () => {
    const cases: [string[], RegExp][] = [
      [["projection", "--rule", "105", "--block", "2", "--projection", "0220"], /every coarse symbol/],
      [["projection", "--rule", "300", "--block", "2", "--projection", "0110"], /rule/],
      [["projection", "--rule", "105", "--projection", "0110"], /--block/],
      [["projection", "--rule", "105", "--block", "9", "--projection", "01"], /maxBlock is 8, this asks for 9/],
      [["decimation", "--matrix", join(FIXTURES, "not-stochastic.csv"), "--steps", "2"], /row 1 sums to 5\/6/],
      [["decimation", "--matrix", join(FIXTURES, "missing.csv"), "--steps", "2"], /cannot read/],
      [["lumping", "--matrix", join(FIXTURES, "weather.csv"), "--partition", "0,1"], /partition/],
      [["shuffle"], /unknown map/],
      [["projection", "--colour", "red"], /colour/],
    ];
    for (const [args, message] of cases) {
      const r = await runCli(run, args);
      expect(r.code, args.join(" ")).toBe(2);
      expect(r.stderr).toMatch(message);
      expect(r.stderr).not.toMatch(/\n\s+at /);
    }
  });

  it("bounds the digits of every matrix entry on the file's text (maxEntryDigits), and the predicted cost before any power", async () => {
    const dir = tempDir();
    try {
      const wide = dir.file("wide.csv", `1/${"3".repeat(1500)},${"3".repeat(1500) + "-1"}\n1,0\n`.replace(`${"3".repeat(1500)}-1`, `${"3".repeat(1499)}2/${"3".repeat(1500)}`));
      const r = await runCli(run, ["decimation", "--matrix", wide, "--steps", "2"]);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(/line 1, column 1: has 1500 digits; the bound is 1000 \(maxEntryDigits\)/);
      const slow = await runCli(run, ["decimation", "--matrix", join(FIXTURES, "weather.csv"), "--steps", "4096", "--max-chain-cost", "1000"]);
      expect(slow.code).toBe(2);
      expect(slow.stderr).toMatch(/too large: maxChainCost is 1000/);
    } finally {
      dir.cleanup();
    }
  });
});
