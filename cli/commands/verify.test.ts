import { describe, expect, it } from "vitest";
import { execFileSync } from "node:child_process";
import { run as certify } from "./certify";
import { EXIT, run } from "./verify";
import { runCli, tempDir } from "@/cli/shared/testSupport";

async function certificate(args: string[]): Promise<string> {
  const r = await runCli(certify, args);
  expect(r.code).toBe(0);
  return r.stdout;
}

describe("cli verify", () => {
  it("exits 0 and prints the content address when the certificate holds", async () => {
    const dir = tempDir();
    try {
      const text = await certificate(["projection", "--rule", "146", "--block", "3", "--projection", "00000001"]);
      const r = await runCli(run, [dir.file("c.json", text)]);
      expect(r.code).toBe(0);
      expect(r.stdout.trim()).toBe(JSON.parse(text).address);
    } finally {
      dir.cleanup();
    }
  });

  it("exits 1 with the counterexample when the claim is false (rule 105 onto 90 claimed instead of 150)", async () => {
    const dir = tempDir();
    try {
      const cert = JSON.parse(await certificate(["projection", "--rule", "105", "--block", "2", "--projection", "0110"]));
      delete cert.address;
      cert.target.rule = 90;
      const r = await runCli(run, [dir.file("c.json", JSON.stringify(cert))]);
      expect(r.code).toBe(1);
      expect(JSON.parse(r.stdout)).toMatchObject({ status: "fails", counterexample: { kind: "coarse-rule-mismatch" } });
    } finally {
      dir.cleanup();
    }
  });

  it("refuses the certificate with any one byte changed (every position of a lumping certificate)", async () => {
    const dir = tempDir();
    try {
      const text = (await certificate(["lumping", "--matrix", "tests/fixtures/core/weather.csv", "--labels", "R,N,S", "--partition", "0,1,0"])).trim();
      const path = dir.file("c.json", text);
      expect((await runCli(run, [path])).code).toBe(0);
      for (let i = 0; i < text.length; i++) {
        const changed = text.slice(0, i) + String.fromCharCode(text.charCodeAt(i) ^ 1) + text.slice(i + 1);
        dir.file("c.json", changed);
        const r = await runCli(run, [path]);
        expect(r.code, `byte ${i}`).not.toBe(0);
      }
    } finally {
      dir.cleanup();
    }
  });

  it("exits 2 and says what is wrong and where for a malformed file", async () => {
    const dir = tempDir();
    try {
      const r = await runCli(run, [dir.file("bad.json", JSON.stringify({ format: "squarely-certificate", version: 1, map: { kind: "decimation" } }))]);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(/map\.steps/);
      expect(r.stderr).toMatch(/source/);
      expect((await runCli(run, [dir.file("x.json", "not json")])).stderr).toMatch(/not JSON/);
      expect((await runCli(run, [])).code).toBe(2);
    } finally {
      dir.cleanup();
    }
  });

  it("exits 2 naming the bound when the check is beyond the limits", async () => {
    const dir = tempDir();
    try {
      const path = dir.file("c.json", await certificate(["projection", "--rule", "105", "--block", "4", "--projection", "0110100110010110"]));
      const r = await runCli(run, [path, "--max-windows", "1000"]);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(/maxWindows is 1000, the check asks for 4096/);
    } finally {
      dir.cleanup();
    }
  });

  it("runs from the repository through npm with the documented exit codes", async () => {
    const dir = tempDir();
    try {
      const path = dir.file("c.json", await certificate(["projection", "--rule", "105", "--block", "2", "--projection", "0110"]));
      const out = execFileSync("npm", ["run", "--silent", "cli", "--", "verify", path], { encoding: "utf8" });
      expect(out.trim()).toMatch(/^sha256:[0-9a-f]{64}$/);
      const bad = dir.file("bad.json", "{}");
      let code = 0;
      try {
        execFileSync("npm", ["run", "--silent", "cli", "--", "verify", bad], { stdio: "pipe" });
      } catch (e) {
        code = (e as { status: number }).status;
      }
      expect(code).toBe(2);
    } finally {
      dir.cleanup();
    }
  });

  it("stops at --deadline with exit 4 and a stopped status when the check has not finished (a 50-state chain decimated 1024 times)", async () => {
    const dir = tempDir();
    try {
      // Row i spreads its mass over states i+1 … i+q (q = 2 + i mod 11): P^1024 has denominators of thousands of digits, several seconds of work.
      const n = 50;
      const matrix = Array.from({ length: n }, (_, i) => {
        const q = 2 + (i % 11);
        return Array.from({ length: n }, (_, j) => ((j - i - 1 + n) % n < q ? `1/${q}` : "0"));
      });
      const chain = { kind: "markov", matrix };
      const path = dir.file("slow.json", JSON.stringify({ format: "squarely-certificate", version: 1, map: { kind: "decimation", steps: 1024 }, source: chain, target: chain }));
      const r = await runCli(run, [path, "--deadline", "1500", "--max-chain-cost", "100000000000000"]);
      expect(r.code).toBe(EXIT.stopped);
      expect(r.code).toBe(4);
      expect(JSON.parse(r.stdout)).toEqual({ status: "stopped", deadlineMs: 1500 });
      expect(r.stderr).toMatch(/stopped: no verdict within 1500 ms \(--deadline\)/);
      const quick = dir.file("c.json", await certificate(["projection", "--rule", "105", "--block", "2", "--projection", "0110"]));
      const ok = await runCli(run, [quick, "--deadline", "120000"]);
      expect(ok.code).toBe(0);
      expect(ok.stdout.trim()).toBe(JSON.parse(await certificate(["projection", "--rule", "105", "--block", "2", "--projection", "0110"])).address);
    } finally {
      dir.cleanup();
    }
  }, 180_000);

  it("documents --deadline and every exit code in --help", async () => {
    const r = await runCli(run, ["--help"]);
    expect(r.code).toBe(0);
    for (const line of [/--deadline MS/, /exit 0 +the square holds/, /exit 1 +the square fails/, /exit 2 +malformed, or beyond a limit/, /exit 4 +stopped/, /--max-chain-cost/]) expect(r.stdout).toMatch(line);
    expect((await runCli(run, ["x.json", "--deadline", "soon"])).stderr).toMatch(/--deadline must be a non-negative integer/);
  });
});
