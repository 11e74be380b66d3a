import { describe, expect, it } from "vitest";
import { join } from "node:path";
import { runCli, tempDir } from "@/cli/shared/testSupport";
import { run } from "./lump";

const OZ = join(process.cwd(), "tests/fixtures/discovery/land-of-oz.csv");

describe("cli lump", () => {
  it("prints the coarsest lumping of the Land of Oz chain keeping 'nice' apart (Kemeny & Snell 1960, §6.3)", async () => {
    const { code, stdout } = await runCli(run, [OZ, "--labels", "0,1,0", "--json"]);
    expect(code).toBe(0);
    expect(JSON.parse(stdout)).toEqual({ partition: [0, 1, 0], blocks: 2, lumped: [["3/4", "1/4"], ["1", "0"]] });
  });

  it("--all lists every lumping", async () => {
    const { stdout } = await runCli(run, [OZ, "--all", "--json"]);
    expect(stdout.trim().split("\n").map((l) => JSON.parse(l).partition)).toEqual([
      [0, 0, 0],
      [0, 1, 0],
      [0, 1, 2],
    ]);
  });

  it("reads Matrix Market files", async () => {
    const dir = tempDir();
    try {
      const file = dir.file("two.mtx", "%%MatrixMarket matrix coordinate real general\n3 3 5\n1 1 0.5\n1 2 0.5\n2 1 0.5\n2 3 0.5\n3 3 1\n");
      const { code, stdout } = await runCli(run, [file, "--labels", "x,x,y", "--json"]);
      expect(code).toBe(0);
      expect(JSON.parse(stdout).partition).toEqual([0, 1, 2]);
    } finally {
      dir.cleanup();
    }
  });

  it("bad input exits 2 with a message naming the problem", async () => {
    expect((await runCli(run, [OZ])).stderr).toMatch(/--labels is required/);
    expect((await runCli(run, [OZ, "--labels", "0,1"])).stderr).toMatch(/2 entries for a 3-state chain/);
    const dir = tempDir();
    try {
      const bad = dir.file("bad.csv", "1/2,1/3\n1/2,1/2\n");
      const r = await runCli(run, [bad, "--labels", "a,b"]);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(/row 1 sums to 5\/6/);
    } finally {
      dir.cleanup();
    }
    expect((await runCli(run, ["/nonexistent.csv", "--labels", "a"])).code).toBe(2);
  });

  it("--exact prints the coarsest exact lumping (hand-worked chain of lib/markov/checkExactLumping.test.ts)", async () => {
    const dir = tempDir();
    try {
      const file = dir.file("hand.csv", "1/2,1/4,1/4\n1/3,1/3,1/3\n1/6,5/12,5/12\n");
      // doubly stochastic: without labels one block is exactly lumpable (every column sums to 1)
      expect(JSON.parse((await runCli(run, [file, "--exact", "--json"])).stdout)).toEqual({ partition: [0, 0, 0], blocks: 1, lumped: [["1"]] });
      const kept = await runCli(run, [file, "--exact", "--labels", "a,b,b", "--json"]);
      expect(kept.code).toBe(0);
      expect(JSON.parse(kept.stdout)).toEqual({ partition: [0, 1, 1], blocks: 2, lumped: [["1/2", "1/2"], ["1/4", "3/4"]] });
      // strongly, rows 1 and 2 send 1/3 and 1/6 into {0}: no merge survives
      expect(JSON.parse((await runCli(run, [file, "--labels", "a,b,b", "--json"])).stdout).partition).toEqual([0, 1, 2]);
    } finally {
      dir.cleanup();
    }
  });

  it("--exact reads a Matrix Market coordinate file sparse, and names a bad line", async () => {
    const dir = tempDir();
    try {
      const file = dir.file("hand.mtx", "%%MatrixMarket matrix coordinate real general\n% a comment\n3 3 9\n1 1 1/2\n1 2 0.25\n1 3 1/4\n2 1 1/3\n2 2 1/3\n2 3 1/3\n3 1 1/6\n3 2 5/12\n3 3 5/12\n");
      const { code, stdout } = await runCli(run, [file, "--exact", "--labels", "a,b,b", "--json"]);
      expect(code).toBe(0);
      expect(JSON.parse(stdout).partition).toEqual([0, 1, 1]);
      const bad = dir.file("bad.mtx", "%%MatrixMarket matrix coordinate real general\n2 2 2\n1 1 1\n2 9 1\n");
      const r = await runCli(run, [bad, "--exact"]);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(/line 4/);
    } finally {
      dir.cleanup();
    }
  });
});
