import { spawn, type ChildProcess } from "node:child_process";
import { randomBytes } from "node:crypto";
import { existsSync, mkdtempSync, rmSync } from "node:fs";
import { connect } from "node:net";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { createDatabase, type Database } from "@/db/client";
import { migrateDatabase } from "@/db/migrate";
import { setDatabase } from "@/db/queries/connection";
import { DEMO_PEOPLE, seedPeople, type DemoPerson } from "@/db/seed/people";
import { listCaughtMessages, type CaughtMessage } from "@/server/mail/store";
import { freePort } from "./ports";

export type TestServer = {
  url: string;
  db: Database;
  people: (DemoPerson & { id: string })[];
  /** The demo person holding `role` (throws when there is none). */
  person: (role: string) => DemoPerson & { id: string };
  workspace: { id: string; slug: string; name: string };
  mailDir: string;
  readMail: () => Promise<CaughtMessage[]>;
  waitForMail: (match: (m: CaughtMessage) => boolean, timeoutMs?: number) => Promise<CaughtMessage>;
  logs: () => string;
  stop: () => Promise<void>;
};

const ROOT = new URL("../../", import.meta.url).pathname;

async function waitFor(what: string, check: () => Promise<boolean>, timeoutMs: number, logs: () => string): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (await check().catch(() => false)) return;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`timed out waiting for ${what}; server output:\n${logs()}`);
}

function canConnect(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = connect(port, "127.0.0.1");
    socket.once("connect", () => {
      socket.destroy();
      resolve(true);
    });
    socket.once("error", () => resolve(false));
  });
}

/**
 * `next start` of the existing production build on a free port, with its own migrated temporary
 * database holding the demo people, and the mail catcher on a free port writing to a temporary
 * directory. The build must exist (`npm test` builds before the end-to-end step).
 */
export async function startTestServer(): Promise<TestServer> {
  if (!existsSync(join(ROOT, ".next", "BUILD_ID")))
    throw new Error("No production build in .next: run `npx next build` before the end-to-end tests.");
  const dir = mkdtempSync(join(tmpdir(), "squarely-e2e-"));
  const databaseUrl = `file:${join(dir, "app.db")}`;
  const mailDir = join(dir, "mail");
  await migrateDatabase(databaseUrl);
  const db = createDatabase(databaseUrl);
  setDatabase(db);
  const { workspace, people } = await seedPeople(db);

  const [port, smtpPort] = [await freePort(), await freePort()];
  const url = `http://127.0.0.1:${port}`;
  let output = "";
  const child: ChildProcess = spawn(process.execPath, [join(ROOT, "node_modules/next/dist/bin/next"), "start", "-p", String(port), "-H", "127.0.0.1"], {
    cwd: ROOT,
    detached: true,
    env: {
      ...process.env,
      NODE_ENV: "production",
      DATABASE_URL: databaseUrl,
      APP_URL: url,
      AUTH_SECRET: randomBytes(24).toString("hex"),
      SMTP_HOST: "127.0.0.1",
      SMTP_PORT: String(smtpPort),
      MAIL_CATCHER: "on",
      MAIL_CATCHER_DIR: mailDir,
      MAIL_OPERATORS: DEMO_PEOPLE.find((p) => p.role === "admin")?.email ?? "",
      JOB_WORKERS: "1",
      NEXT_TELEMETRY_DISABLED: "1",
    },
    stdio: ["ignore", "pipe", "pipe"],
  });
  child.stdout?.on("data", (d) => (output += d));
  child.stderr?.on("data", (d) => (output += d));
  const logs = () => output;
  const exited = new Promise<void>((resolve) => child.once("exit", () => resolve()));

  const stop = async () => {
    if (child.exitCode === null && child.pid) {
      try {
        process.kill(-child.pid, "SIGTERM");
      } catch {
        /* already gone */
      }
      await Promise.race([exited, new Promise((r) => setTimeout(r, 5000))]);
    }
    setDatabase(null);
    db.$client.close();
    rmSync(dir, { recursive: true, force: true });
  };

  try {
    await waitFor("the app", async () => (await fetch(`${url}/sign-in`)).ok, 90_000, logs);
    await waitFor("the mail catcher", () => canConnect(smtpPort), 30_000, logs);
  } catch (err) {
    await stop();
    throw err;
  }

  const readMail = () => listCaughtMessages(mailDir);
  const waitForMail = async (match: (m: CaughtMessage) => boolean, timeoutMs = 20_000) => {
    let found: CaughtMessage | undefined;
    await waitFor("a caught message", async () => Boolean((found = (await readMail()).find(match))), timeoutMs, logs);
    return found as CaughtMessage;
  };
  const person = (role: string) => {
    const found = people.find((p) => p.role === role);
    if (!found) throw new Error(`no demo ${role}`);
    return found;
  };
  return { url, db, people, person, workspace, mailDir, readMail, waitForMail, logs, stop };
}
