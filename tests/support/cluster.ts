import { spawn, type ChildProcess } from "node:child_process";
import { join } from "node:path";

const ROOT = new URL("../../", import.meta.url).pathname;

export type NodeProcess = {
  pid: number;
  /** The port it serves on ("ready <port>"), 0 for processes that serve nothing. */
  port: number;
  /** The lease owner its runner or worker writes on the jobs it claims. */
  owner: string | null;
  output: () => string;
  waitForLine: (pattern: RegExp, timeoutMs?: number) => Promise<RegExpMatchArray>;
  /** SIGKILL, as a crash: no handler runs. */
  killHard: () => Promise<void>;
  stop: () => Promise<void>;
};

/** Starts tests/support/job-node.ts in `role` with the given environment, and waits until it is ready. */
export async function startNode(role: "app" | "worker" | "writer", env: Record<string, string>): Promise<NodeProcess> {
  const child: ChildProcess = spawn(process.execPath, ["--conditions=react-server", "--import", "tsx", join(ROOT, "tests/support/job-node.ts"), role], {
    cwd: ROOT,
    env: { ...process.env, NODE_ENV: "test", MAIL_CATCHER: "off", NEXT_TELEMETRY_DISABLED: "1", ...env },
    stdio: ["ignore", "pipe", "pipe"],
  });
  let out = "";
  child.stdout?.on("data", (d) => (out += d));
  child.stderr?.on("data", (d) => (out += d));
  const exited = new Promise<void>((resolve) => child.once("exit", () => resolve()));
  const waitForLine = async (pattern: RegExp, timeoutMs = 90_000) => {
    const deadline = Date.now() + timeoutMs;
    for (;;) {
      const match = out.match(pattern);
      if (match) return match;
      if (child.exitCode !== null || Date.now() > deadline) throw new Error(`${role} process: no line ${pattern} (exit ${child.exitCode}); output:\n${out}`);
      await new Promise((r) => setTimeout(r, 50));
    }
  };
  const signal = async (sig: NodeJS.Signals) => {
    if (child.exitCode !== null || child.signalCode !== null) return;
    child.kill(sig);
    await Promise.race([exited, new Promise((r) => setTimeout(r, 10_000))]);
  };
  const ready = await waitForLine(/^ready (\d+)$/m);
  const owner = out.match(/^owner (\S+)$/m)?.[1] ?? null;
  return {
    pid: child.pid ?? 0,
    port: Number(ready[1]),
    owner,
    output: () => out,
    waitForLine,
    killHard: () => signal("SIGKILL"),
    stop: () => signal("SIGTERM"),
  };
}
