import { describe, expect, it } from "vitest";
import { runCli, tempDir } from "@/cli/shared/testSupport";
import { verifyCertificate } from "@/lib/verify";
import { run } from "./certify";

/** Hand-worked chain of lib/markov/checkExactLumping.test.ts (exact lumpability, Buchholz 1994). */
const HAND = "1/2,1/4,1/4\n1/3,1/3,1/3\n1/6,5/12,5/12\n";

describe("cli certify lumping --exact", () => {
  it("exits 0 with a certificate the checker verifies when the partition is exactly lumpable", async () => {
    const dir = tempDir();
    try {
      const file = dir.file("hand.csv", HAND);
      const { code, stdout } = await runCli(run, ["lumping", "--exact", "--matrix", file, "--partition", "0,1,1"]);
      expect(code).toBe(0);
      const cert = JSON.parse(stdout);
      expect(cert.map).toEqual({ kind: "exact-lumping", partition: [0, 1, 1], steps: 1 });
      expect(cert.target.matrix).toEqual([["1/2", "1/2"], ["1/4", "3/4"]]);
      expect(verifyCertificate(cert).status).toBe("holds");
    } finally {
      dir.cleanup();
    }
  });

  it("exits 1 with the counterexample: two states of the target block and both column sums", async () => {
    const dir = tempDir();
    try {
      const file = dir.file("hand.csv", HAND);
      const { code, stdout } = await runCli(run, ["lumping", "--exact", "--matrix", file, "--partition", "0,0,1"]);
      expect(code).toBe(1);
      expect(JSON.parse(stdout)).toEqual({
        status: "fails",
        counterexample: { kind: "not-exactly-lumpable", block: 0, targetBlock: 0, states: [0, 1], sums: ["5/6", "7/12"] },
      });
    } finally {
      dir.cleanup();
    }
  });
});
