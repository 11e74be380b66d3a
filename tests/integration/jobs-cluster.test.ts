import { readFileSync } from "node:fs";
import { join } from "node:path";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { jobs, type Job } from "@/db/schema";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { startNode, type NodeProcess } from "@/tests/support/cluster";
import { startRedis, type TestRedis } from "@/tests/support/redis";
import { seedPeople, waitFor } from "./jobs-fixtures";

/** Short, so that a takeover is quick to test; the app's default is 30 s. */
const LEASE_MS = 4_000;
const JOB_COUNT = 100;

describe.each(["in-process", "bullmq"] as const)("two app processes on one database, %s queue", (mode) => {
  let t: TestDatabase;
  let redis: TestRedis | null = null;
  let apps: NodeProcess[] = [];
  let workers: NodeProcess[] = [];
  let ws: string;
  let owners: string[];

  beforeAll(async () => {
    t = await createTestDatabase();
    const seeded = await seedPeople(t.db);
    ws = seeded.workspace.id;
    owners = Object.values(seeded.people).map((p) => p.id);
    if (mode === "bullmq") redis = await startRedis();
    const env = {
      DATABASE_URL: t.url,
      JOB_QUEUE: mode,
      ...(redis ? { REDIS_URL: redis.url } : {}),
      JOB_LEASE_MS: String(LEASE_MS),
      JOBS_PER_USER: "100",
    };
    const appWorkers = mode === "in-process" ? "2" : "0";
    apps = await Promise.all([startNode("app", { ...env, JOB_WORKERS: appWorkers }), startNode("app", { ...env, JOB_WORKERS: appWorkers })]);
    if (mode === "bullmq") workers = await Promise.all([startNode("worker", { ...env, JOB_WORKERS: "2" }), startNode("worker", { ...env, JOB_WORKERS: "2" })]);
  }, 240_000);

  afterAll(async () => {
    await Promise.all([...apps, ...workers].map((p) => p.stop()));
    await redis?.stop();
    t?.cleanup();
  });

  const rows = () => t.db.select().from(jobs);
  const row = async (id: string) => (await t.db.select().from(jobs).where(eq(jobs.id, id)))[0] as Job;
  const submit = async (app: NodeProcess, params: Record<string, unknown>, ownerId: string) => {
    const res = await fetch(`http://127.0.0.1:${app.port}/jobs`, {
      method: "POST",
      body: JSON.stringify({ workspaceId: ws, ownerId, kind: "test-sleep-and-count", params }),
    });
    expect(res.status).toBe(201);
    return (await res.json()) as { id: string };
  };

  it(`runs each of ${JOB_COUNT} jobs submitted through both processes exactly once`, async () => {
    const runLog = join(t.dir, "runs.log");
    const ids: string[] = [];
    for (let batch = 0; batch < JOB_COUNT; batch += 10) {
      const made = await Promise.all(
        Array.from({ length: 10 }, (_, k) => batch + k).map((i) =>
          submit(apps[i % 2], { steps: 1, stepMs: 5, runLog, mark: `job-${i}` }, owners[i % owners.length]),
        ),
      );
      ids.push(...made.map((j) => j.id));
    }
    const done = await waitFor(rows, (all) => all.length === JOB_COUNT && all.every((j) => j.status === "succeeded" || j.status === "failed"), 180_000);
    expect(new Set(ids).size).toBe(JOB_COUNT);
    expect(done.filter((j) => j.status === "succeeded")).toHaveLength(JOB_COUNT);
    expect(done.every((j) => j.attempts === 1)).toBe(true);
    const runs = readFileSync(runLog, "utf8").trim().split("\n").sort();
    expect(runs).toEqual(Array.from({ length: JOB_COUNT }, (_, i) => `job-${i}`).sort());
    const byRunner = new Map<string, number>();
    for (const j of done) byRunner.set(j.leaseOwner ?? "?", (byRunner.get(j.leaseOwner ?? "?") ?? 0) + 1);
    console.log(`${mode}: ${JOB_COUNT} jobs, each run once; jobs per runner: ${[...byRunner.values()].join(", ")}`);
  });

  it("takes over (or fails with a reason) a job whose worker was killed with SIGKILL mid-job; it is never lost", async () => {
    const runLog = join(t.dir, "long.log");
    const job = await submit(apps[0], { steps: 100, stepMs: 100, runLog, mark: "long" }, owners[0]);
    const running = await waitFor(() => row(job.id), (j) => j.status === "running" && j.progress > 0.05, 60_000);
    const holders = mode === "in-process" ? apps : workers;
    const holder = holders.find((p) => p.owner === running.leaseOwner);
    expect(holder).toBeDefined();
    const killedAt = Date.now();
    await holder!.killHard();

    const finished = await waitFor(() => row(job.id), (j) => j.status !== "queued" && j.status !== "running", 120_000);
    const takeoverMs = finished.startedAt ? finished.startedAt.getTime() - killedAt : NaN;
    console.log(`${mode}: killed job ended ${finished.status} after attempt ${finished.attempts}; taken over ${takeoverMs} ms after the kill (lease ${LEASE_MS} ms)`);
    if (finished.status === "succeeded") {
      expect(finished.attempts).toBe(2);
      expect(finished.leaseOwner).not.toBe(running.leaseOwner);
      // The second run began only after the first runner was dead and its lease had lapsed.
      expect(takeoverMs).toBeGreaterThan(0);
      expect(readFileSync(runLog, "utf8").trim().split("\n")).toEqual(["long", "long"]);
      expect(finished.result).toBe(JSON.stringify({ stopped: null, counted: 100, kept: 0 }));
    } else {
      expect(finished.status).toBe("failed");
      expect(finished.error).toMatch(/worker stopped \d+ times/);
    }
  });
});
