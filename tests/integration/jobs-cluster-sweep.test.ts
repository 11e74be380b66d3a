import { readFileSync } from "node:fs";
import { join } from "node:path";
import { eq } from "drizzle-orm";
import { Worker } from "bullmq";
import { Redis } from "ioredis";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createJobWithinLimit } from "@/db/queries/jobs";
import { jobs, type Job } from "@/db/schema";
import { BULLMQ_QUEUE_NAMES, openBullmqLanes, redisConnection } from "@/server/jobs/bullmq-lanes";
import { sweepLostJobs } from "@/server/jobs/bullmq-sweep";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { startNode, type NodeProcess } from "@/tests/support/cluster";
import { startRedis, type TestRedis } from "@/tests/support/redis";
import { seedPeople, waitFor } from "./jobs-fixtures";

/** Short, so that the sweep (every lease) and takeovers are quick to test; the app's default is 30 s. */
const LEASE_MS = 4_000;

/**
 * Jobs that BullMQ lost while their rows say queued or running: without the sweep in the worker
 * processes (server/jobs/bullmq-sweep.ts) each of these rows would stay as it is for ever, since
 * no BullMQ job exists to bring it to a worker.
 */
describe("BullMQ lost-job sweep: one app process and two worker processes on one database and a real Redis", () => {
  let t: TestDatabase;
  let redis: TestRedis;
  let app: NodeProcess;
  let workers: NodeProcess[] = [];
  let ws: string;
  let ownerId: string;

  beforeAll(async () => {
    t = await createTestDatabase();
    const seeded = await seedPeople(t.db);
    ws = seeded.workspace.id;
    ownerId = seeded.people.contributor.id;
    redis = await startRedis();
    const env = { DATABASE_URL: t.url, JOB_QUEUE: "bullmq", REDIS_URL: redis.url, JOB_LEASE_MS: String(LEASE_MS), JOBS_PER_USER: "100" };
    app = await startNode("app", { ...env, JOB_WORKERS: "0" });
    workers = await Promise.all([startNode("worker", { ...env, JOB_WORKERS: "1" }), startNode("worker", { ...env, JOB_WORKERS: "1" })]);
  }, 240_000);

  afterAll(async () => {
    await Promise.all([app, ...workers].filter(Boolean).map((p) => p.stop()));
    await redis?.stop();
    t?.cleanup();
  });

  const row = async (id: string) => (await t.db.select().from(jobs).where(eq(jobs.id, id)))[0] as Job;
  const finished = (id: string) => waitFor(() => row(id), (j) => j.status !== "queued" && j.status !== "running", 120_000);
  const runs = (file: string) => readFileSync(file, "utf8").trim().split("\n");
  /** A row written as enqueue writes it, but never added to BullMQ: the app died between the two. */
  const admitOnly = async (params: Record<string, unknown>) => {
    const created = await createJobWithinLimit({ db: t.db, workspaceId: ws, ownerId, kind: "test-sleep-and-count", params, limit: 100, lane: "large" });
    if (!created.ok) throw new Error("not admitted");
    return created.job;
  };

  it("runs, once, a job whose row was written but that never reached Redis", async () => {
    const runLog = join(t.dir, "orphan.log");
    const job = await admitOnly({ steps: 1, stepMs: 5, runLog, mark: "orphan" });
    const done = await finished(job.id);
    expect(done.status).toBe("succeeded");
    expect(done.attempts).toBe(1);
    // The sweep leaves a queued row alone for one lease (enqueue adds it to Redis right after writing it).
    expect(done.startedAt!.getTime() - job.createdAt.getTime()).toBeGreaterThanOrEqual(LEASE_MS);
    await new Promise((r) => setTimeout(r, 2 * LEASE_MS));
    expect(runs(runLog)).toEqual(["orphan"]);
    console.log(`sweep: a job never handed to Redis ran ${done.startedAt!.getTime() - job.createdAt.getTime()} ms after its row was written (lease ${LEASE_MS} ms)`);
  });

  it("takes over a running job whose worker was killed (SIGKILL) while Redis lost all its data", async () => {
    const runLog = join(t.dir, "long.log");
    const res = await fetch(`http://127.0.0.1:${app.port}/jobs`, {
      method: "POST",
      body: JSON.stringify({ workspaceId: ws, ownerId, kind: "test-sleep-and-count", params: { steps: 60, stepMs: 100, runLog, mark: "long" } }),
    });
    expect(res.status).toBe(201);
    const { id } = (await res.json()) as { id: string };
    const running = await waitFor(() => row(id), (j) => j.status === "running" && j.progress > 0.05, 60_000);
    const holder = workers.find((w) => w.owner === running.leaseOwner)!;
    const survivor = workers.find((w) => w !== holder)!;
    expect(holder).toBeDefined();
    const killedAt = Date.now();
    await holder.killHard();
    // A Redis restarted without persistence: BullMQ's record of the job (and its lock) is gone.
    const client = new Redis(redis.url);
    expect(await client.flushall()).toBe("OK");
    client.disconnect();

    const done = await finished(id);
    console.log(`sweep: a job lost with its worker and Redis ended ${done.status} after attempt ${done.attempts}, ${done.startedAt!.getTime() - killedAt} ms after the kill (lease ${LEASE_MS} ms)`);
    expect(done.status).toBe("succeeded");
    expect(done.attempts).toBe(2);
    expect(done.leaseOwner).toBe(survivor.owner);
    expect(runs(runLog)).toEqual(["long", "long"]);
    expect(done.result).toBe(JSON.stringify({ stopped: null, counted: 60, kept: 0 }));
  });

  it("fails with a reason a lost running job that has already had its attempts, without running it", async () => {
    const runLog = join(t.dir, "spent.log");
    const job = await admitOnly({ steps: 1, stepMs: 5, runLog, mark: "spent" });
    // Its second runner died too, and its BullMQ copy is gone.
    await t.db
      .update(jobs)
      .set({ status: "running", attempts: 2, leaseOwner: "a-dead-worker", leaseExpiresAt: new Date(Date.now() - 1_000), startedAt: new Date() })
      .where(eq(jobs.id, job.id));
    const done = await finished(job.id);
    expect(done.status).toBe("failed");
    expect(done.error).toBe("its worker stopped 2 times before the job finished (lease expired); not retried again");
    expect(() => readFileSync(runLog)).toThrow();
  });
});

describe("sweepLostJobs, row by row, against a real Redis with no worker running", () => {
  let t: TestDatabase;
  let redis: TestRedis;
  let lanes: ReturnType<typeof openBullmqLanes>;
  let ws: string;
  let ownerId: string;

  beforeAll(async () => {
    t = await createTestDatabase();
    const seeded = await seedPeople(t.db);
    ws = seeded.workspace.id;
    ownerId = seeded.people.contributor.id;
    redis = await startRedis();
    lanes = openBullmqLanes(redis.url);
  }, 60_000);

  afterAll(async () => {
    await lanes?.close();
    await redis?.stop();
    t?.cleanup();
  });

  const GRACE_MS = 60_000;
  const now = new Date();
  const ago = (ms: number) => new Date(now.getTime() - ms);
  /** A job row of the test kind, changed as given (no BullMQ job yet). */
  const jobRow = async (mark: string, change: Partial<Job>) => {
    const created = await createJobWithinLimit({ db: t.db, workspaceId: ws, ownerId, kind: "test-sleep-and-count", params: { steps: 1, stepMs: 0, mark }, limit: 100 });
    if (!created.ok) throw new Error("not admitted");
    const [row] = await t.db.update(jobs).set(change).where(eq(jobs.id, created.job.id)).returning();
    return row;
  };

  it("dispatches again what BullMQ lost, fails what had its attempts, and leaves alone what is held or on its way", async () => {
    // BullMQ gave up on this one (its processor failed) while its row stayed running under a lease that lapsed.
    const gaveUp = await jobRow("gave-up", { status: "running", attempts: 1, leaseOwner: "gone", leaseExpiresAt: ago(5_000), createdAt: ago(120_000) });
    await lanes.large.add(gaveUp.kind, { jobId: gaveUp.id }, { jobId: gaveUp.id, removeOnFail: 1000 });
    const failing = new Worker(BULLMQ_QUEUE_NAMES.large, async () => Promise.reject(new Error("processor failed")), { connection: redisConnection(redis.url) });
    await waitFor(() => lanes.large.getJobState(gaveUp.id), (state) => state === "failed", 30_000);
    await failing.close();

    const neverAdded = await jobRow("never-added", { createdAt: ago(120_000) });
    const waiting = await jobRow("waiting", { createdAt: ago(120_000) });
    await lanes.large.add(waiting.kind, { jobId: waiting.id }, { jobId: waiting.id });
    const justWritten = await jobRow("just-written", { createdAt: ago(1_000) });
    const spent = await jobRow("spent", { status: "running", attempts: 2, leaseOwner: "gone", leaseExpiresAt: ago(5_000), createdAt: ago(120_000) });
    const held = await jobRow("held", { status: "running", attempts: 1, leaseOwner: "alive", leaseExpiresAt: new Date(now.getTime() + 30_000), createdAt: ago(120_000) });

    const report = await sweepLostJobs({ db: t.db, lanes, graceMs: GRACE_MS, now });
    expect(report.redispatched.sort()).toEqual([gaveUp.id, neverAdded.id].sort());
    expect(report.failed).toEqual([spent.id]);

    const live = ["waiting", "prioritized"];
    expect(live).toContain(await lanes.large.getJobState(gaveUp.id));
    expect(live).toContain(await lanes.large.getJobState(neverAdded.id));
    expect(live).toContain(await lanes.large.getJobState(waiting.id));
    expect(await lanes.large.getJobState(justWritten.id)).toBe("unknown");
    expect(await lanes.large.getJobState(held.id)).toBe("unknown");
    const byId = new Map((await t.db.select().from(jobs)).map((j) => [j.id, j]));
    expect(byId.get(spent.id)!.status).toBe("failed");
    expect(byId.get(spent.id)!.error).toBe("its worker stopped 2 times before the job finished (lease expired); not retried again");
    expect(byId.get(gaveUp.id)!.status).toBe("running"); // the worker that receives it takes it over
    expect(byId.get(held.id)!.leaseOwner).toBe("alive");

    // A second sweep finds each lost job on its way now: nothing more to do.
    expect(await sweepLostJobs({ db: t.db, lanes, graceMs: GRACE_MS, now })).toEqual({ redispatched: [], failed: [] });
  });
});
