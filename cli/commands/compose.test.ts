import { describe, expect, it } from "vitest";
import { run as certify } from "./certify";
import { run } from "./compose";
import { runCli, tempDir } from "@/cli/shared/testSupport";

describe("cli compose", () => {
  it("pastes 146 → 128 (block 3) and 128 → 128 (block 2) into 146 → 128 at block 6 and says how it was verified", async () => {
    const dir = tempDir();
    try {
      const a = dir.file("a.json", (await runCli(certify, ["projection", "--rule", "146", "--block", "3", "--projection", "00000001"])).stdout);
      const b = dir.file("b.json", (await runCli(certify, ["projection", "--rule", "128", "--block", "2", "--projection", "0001"])).stdout);
      const r = await runCli(run, [a, b]);
      expect(r.code).toBe(0);
      const composite = JSON.parse(r.stdout);
      expect(composite.map).toMatchObject({ kind: "projection", block: 6, steps: 6 });
      expect(composite.map.projection.filter((x: number) => x === 1)).toHaveLength(1);
      expect(r.stderr).toMatch(/the composite directly/);
    } finally {
      dir.cleanup();
    }
  });

  it("exits 1 and names the link that does not meet the next", async () => {
    const dir = tempDir();
    try {
      const a = dir.file("a.json", (await runCli(certify, ["projection", "--rule", "105", "--block", "2", "--projection", "0110"])).stdout);
      const b = dir.file("b.json", (await runCli(certify, ["projection", "--rule", "128", "--block", "2", "--projection", "0001"])).stdout);
      const r = await runCli(run, [a, b]);
      expect(r.code).toBe(1);
      expect(r.stderr).toMatch(/link 1 \(.*a\.json\).*ECA 150.*ECA 128/);
    } finally {
      dir.cleanup();
    }
  });

  it("exits 2 when a file is not a certificate", async () => {
    const dir = tempDir();
    try {
      const r = await runCli(run, [dir.file("a.json", "[]")]);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(/a\.json/);
    } finally {
      dir.cleanup();
    }
  });
});
