import { spawn } from "node:child_process";
import { mkdtempSync, rmSync } from "node:fs";
import { connect } from "node:net";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { freePort } from "./ports";

export type TestRedis = { url: string; port: number; stop: () => Promise<void> };

/** Debian's redis-server (REDIS_SERVER overrides the path). */
export const REDIS_SERVER = process.env.REDIS_SERVER ?? "/usr/bin/redis-server";

function ping(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = connect(port, "127.0.0.1");
    socket.once("connect", () => socket.write("PING\r\n"));
    socket.once("data", (d) => {
      socket.destroy();
      resolve(d.toString().startsWith("+PONG"));
    });
    socket.once("error", () => resolve(false));
  });
}

/**
 * A private redis-server on a free loopback port, with its files in a temporary directory and no
 * persistence; `stop` ends it and removes the directory.
 */
export async function startRedis(): Promise<TestRedis> {
  const dir = mkdtempSync(join(tmpdir(), "squarely-redis-"));
  const port = await freePort();
  const child = spawn(REDIS_SERVER, ["--port", String(port), "--bind", "127.0.0.1", "--dir", dir, "--save", "", "--appendonly", "no"], {
    stdio: ["ignore", "pipe", "pipe"],
  });
  let output = "";
  child.stdout?.on("data", (d) => (output += d));
  child.stderr?.on("data", (d) => (output += d));
  const exited = new Promise<void>((resolve) => child.once("exit", () => resolve()));
  const stop = async () => {
    if (child.exitCode === null) {
      child.kill("SIGTERM");
      await Promise.race([exited, new Promise((r) => setTimeout(r, 5000))]);
    }
    rmSync(dir, { recursive: true, force: true });
  };
  const deadline = Date.now() + 20_000;
  while (!(await ping(port))) {
    if (child.exitCode !== null || Date.now() > deadline) {
      await stop();
      throw new Error(`redis-server did not start on port ${port}:\n${output}`);
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  return { url: `redis://127.0.0.1:${port}`, port, stop };
}
