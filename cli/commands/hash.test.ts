import { describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import canonicalize from "canonicalize";
import { run as certify } from "./certify";
import { run } from "./hash";
import { runCli, tempDir } from "@/cli/shared/testSupport";

describe("cli hash", () => {
  it("prints sha256 of the RFC 8785 form of the certificate without its seal, the same for a re-spelled file", async () => {
    const dir = tempDir();
    try {
      const cert = JSON.parse((await runCli(certify, ["decimation", "--matrix", "tests/fixtures/core/weather.csv", "--steps", "1"])).stdout);
      const { address, ...content } = cert;
      const expected = `sha256:${createHash("sha256").update(canonicalize(content) as string).digest("hex")}`;
      expect(address).toBe(expected);
      const respelled = JSON.stringify(content, null, 2).replaceAll('"1/2"', '"0.5"');
      const r = await runCli(run, [dir.file("c.json", respelled)]);
      expect(r).toMatchObject({ code: 0, stdout: `${expected}\n` });
    } finally {
      dir.cleanup();
    }
  });

  it("exits 2 for a file that is not a certificate", async () => {
    const dir = tempDir();
    try {
      const r = await runCli(run, [dir.file("c.json", '{"format":"other"}')]);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(/format/);
    } finally {
      dir.cleanup();
    }
  });
});
