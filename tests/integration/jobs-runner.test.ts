import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { eq } from "drizzle-orm";
import { jobs } from "@/db/schema";
import { claimJob } from "@/db/queries/jobs";
import { createInProcessQueue } from "@/server/jobs/in-process-queue";
import { createJobRunner, type JobRunner } from "@/server/jobs/job-runner";
import { registerJobKind } from "@/server/jobs/kinds/registry";
import { defineJobKind } from "@/server/jobs/kinds/types";
import type { JobQueue, JobView } from "@/server/jobs/queue";
import { AppError } from "@/server/errors";
import { SleepAndCountParams } from "./jobs-sleep-kind";
import { TEST_COMPUTES } from "./jobs-computes";
import { seedPeople, waitFor } from "./jobs-fixtures";

registerJobKind(defineJobKind({ name: "test-sleep-and-count", title: "Count", paramsSchema: SleepAndCountParams, compute: "test-sleep-and-count", timeoutMs: 20_000 }));
registerJobKind(defineJobKind({ name: "test-short-bound", title: "Count, 600 ms bound", paramsSchema: SleepAndCountParams, compute: "test-sleep-and-count", timeoutMs: 600 }));

let t: TestDatabase;
let queue: JobQueue;
let runner: JobRunner;
let ws: string;
let people: Awaited<ReturnType<typeof seedPeople>>["people"];

beforeAll(async () => {
  t = await createTestDatabase();
  ({ workspace: { id: ws }, people } = await seedPeople(t.db));
  queue = createInProcessQueue({ db: t.db, perUserLimit: 3 });
  runner = createJobRunner({ db: t.db, computes: TEST_COMPUTES, workers: 2, memoryMb: 96, pollMs: 100, graceMs: 800 });
  await runner.start();
});

afterAll(async () => {
  await runner.stop();
  t.cleanup();
});

const get = (id: string) => queue.get({ jobId: id, workspaceId: ws }) as Promise<JobView>;
const finished = (j: JobView) => !["queued", "running"].includes(j.status);

describe("the in-process job queue", () => {
  it("persists progress while a job runs and its result when it succeeds", async () => {
    const job = await queue.enqueue({ workspaceId: ws, ownerId: people.contributor.id, kind: "test-sleep-and-count", params: { steps: 30, stepMs: 60 } });
    expect(job.status).toBe("queued");
    const midway = await waitFor(() => get(job.id), (j) => j.status === "running" && j.progress > 0.2);
    expect(midway.progress).toBeLessThan(1);
    expect(midway.currentItem).toMatch(/^step \d+ of 30$/);
    const done = await waitFor(() => get(job.id), finished);
    expect(done.status).toBe("succeeded");
    expect(done.progress).toBe(1);
    expect(done.result).toEqual({ stopped: null, counted: 30, kept: 0 });
    expect(done.attempts).toBe(1);
    expect(done.finishedAt).not.toBeNull();
  });

  it("refuses bad parameters with a 400 naming the field, and writes no row", async () => {
    const before = await t.db.select().from(jobs);
    const err = await queue
      .enqueue({ workspaceId: ws, ownerId: people.contributor.id, kind: "test-sleep-and-count", params: { steps: -1, stepMs: 1 } })
      .catch((e) => e);
    expect(err).toBeInstanceOf(AppError);
    expect(err.status).toBe(400);
    expect(err.field).toBe("params.steps");
    const unknown = await queue.enqueue({ workspaceId: ws, ownerId: people.contributor.id, kind: "no-such-kind", params: {} }).catch((e) => e);
    expect(unknown.status).toBe(400);
    expect(unknown.field).toBe("kind");
    expect(await t.db.select().from(jobs)).toHaveLength(before.length);
  });

  it("lets the owner cancel a running job that never yields its thread (cooperatively, through shared memory)", async () => {
    const job = await queue.enqueue({ workspaceId: ws, ownerId: people.contributor.id, kind: "test-sleep-and-count", params: { steps: 400, stepMs: 50 } });
    await waitFor(() => get(job.id), (j) => j.status === "running" && j.progress > 0);
    const asked = await queue.cancel({ jobId: job.id, workspaceId: ws, actor: { userId: people.contributor.id, role: "contributor" } });
    expect(asked.cancelRequested).toBe(true);
    const done = await waitFor(() => get(job.id), finished, 5_000);
    expect(done.status).toBe("cancelled");
    expect((done.result as { stopped: string; counted: number }).stopped).toBe("cancelled");
    expect((done.result as { counted: number }).counted).toBeLessThan(400);
  });

  it("terminates the thread of a job that ignores the cancel request after the grace period", async () => {
    const job = await queue.enqueue({
      workspaceId: ws,
      ownerId: people.contributor.id,
      kind: "test-sleep-and-count",
      params: { steps: 400, stepMs: 50, ignoreCancel: true },
    });
    await waitFor(() => get(job.id), (j) => j.status === "running" && j.progress > 0);
    const asked = Date.now();
    await queue.cancel({ jobId: job.id, workspaceId: ws, actor: { userId: people.contributor.id, role: "contributor" } });
    const done = await waitFor(() => get(job.id), finished, 5_000);
    expect(done.status).toBe("cancelled");
    expect(Date.now() - asked).toBeLessThan(4_000);
  });

  it("lets only the owner or an admin cancel", async () => {
    const job = await queue.enqueue({ workspaceId: ws, ownerId: people.contributor.id, kind: "test-sleep-and-count", params: { steps: 200, stepMs: 50 } });
    for (const who of [people.otherContributor, people.curator, people.viewer]) {
      const err = await queue.cancel({ jobId: job.id, workspaceId: ws, actor: { userId: who.id, role: who.role } }).catch((e) => e);
      expect(err.status, who.email).toBe(403);
    }
    const missing = await queue.cancel({ jobId: "nope", workspaceId: ws, actor: { userId: people.admin.id, role: "admin" } }).catch((e) => e);
    expect(missing.status).toBe(404);
    await queue.cancel({ jobId: job.id, workspaceId: ws, actor: { userId: people.admin.id, role: "admin" } });
    expect((await waitFor(() => get(job.id), finished, 5_000)).status).toBe("cancelled");

  });

  it("fails a job that exceeds its time bound, with the bound in the reason", async () => {
    const job = await queue.enqueue({ workspaceId: ws, ownerId: people.contributor.id, kind: "test-short-bound", params: { steps: 100, stepMs: 50, ignoreCancel: true } });
    const done = await waitFor(() => get(job.id), finished, 8_000);
    expect(done.status).toBe("failed");
    expect(done.error).toBe("stopped: exceeded its time bound of 600 ms");
  });

  it("fails a job that exceeds its memory bound, and the pool keeps working", async () => {
    const job = await queue.enqueue({ workspaceId: ws, ownerId: people.contributor.id, kind: "test-sleep-and-count", params: { steps: 60, stepMs: 0, allocateMb: 16 } });
    const done = await waitFor(() => get(job.id), finished, 60_000);
    expect(done.status).toBe("failed");
    expect(done.error).toBe("the job exceeded its memory bound of 96 MB");
    const next = await queue.enqueue({ workspaceId: ws, ownerId: people.contributor.id, kind: "test-sleep-and-count", params: { steps: 3, stepMs: 1 } });
    expect((await waitFor(() => get(next.id), finished)).status).toBe("succeeded");
  });

  it("records an exception thrown inside the computation as a failure with its message", async () => {
    const job = await queue.enqueue({ workspaceId: ws, ownerId: people.contributor.id, kind: "test-sleep-and-count", params: { steps: 10, stepMs: 1, failAt: 4 } });
    const done = await waitFor(() => get(job.id), finished);
    expect(done.status).toBe("failed");
    expect(done.error).toBe("asked to fail at step 4");
  });

  it("answers 429 beyond the per-user bound of queued and running jobs, and counts per user", async () => {
    const mine = [];
    for (let i = 0; i < 3; i++) {
      mine.push(await queue.enqueue({ workspaceId: ws, ownerId: people.curator.id, kind: "test-sleep-and-count", params: { steps: 500, stepMs: 20 } }));
    }
    const err = await queue.enqueue({ workspaceId: ws, ownerId: people.curator.id, kind: "test-sleep-and-count", params: { steps: 1, stepMs: 0 } }).catch((e) => e);
    expect(err).toBeInstanceOf(AppError);
    expect(err.status).toBe(429);
    expect(err.code).toBe("too_many_jobs");
    const someoneElse = await queue.enqueue({ workspaceId: ws, ownerId: people.otherContributor.id, kind: "test-sleep-and-count", params: { steps: 1, stepMs: 0 } });
    expect(someoneElse.status).toBe("queued");
    for (const job of mine) await queue.cancel({ jobId: job.id, workspaceId: ws, actor: { userId: people.curator.id, role: "curator" } });
    await Promise.all(mine.map((job) => waitFor(() => get(job.id), finished, 8_000)));
    const again = await queue.enqueue({ workspaceId: ws, ownerId: people.curator.id, kind: "test-sleep-and-count", params: { steps: 1, stepMs: 0 } });
    expect((await waitFor(() => get(again.id), finished)).status).toBe("succeeded");
  });

  it("lists a workspace's jobs newest first with a cursor", async () => {
    const first = await queue.list({ workspaceId: ws, limit: 2 });
    expect(first.items).toHaveLength(2);
    expect(first.nextCursor).not.toBeNull();
    const second = await queue.list({ workspaceId: ws, limit: 2, cursor: first.nextCursor });
    expect(second.items.map((j) => j.id)).not.toContain(first.items[0].id);
    expect(Date.parse(first.items[1].createdAt)).toBeGreaterThanOrEqual(Date.parse(second.items[0].createdAt));
    const other = await queue.list({ workspaceId: "another-workspace" });
    expect(other.items).toEqual([]);
  });
});

describe("leases: a job whose runner died is taken over after its lease runs out", () => {
  // A runner that died: it claimed the job with a lease and never renewed it.
  const deadClaim = (id: string) => claimJob({ db: t.db, id, owner: "dead-runner", leaseMs: 1_000, now: new Date(Date.now() - 60_000) });
  const liveClaim = (id: string) => claimJob({ db: t.db, id, owner: "live-runner", leaseMs: 60_000 });

  it("re-queues a job whose lease lapsed once, then fails it with a reason when it lapses again; a held lease is left alone", async () => {
    await runner.drain();
    await runner.stop();
    const job = await queue.enqueue({ workspaceId: ws, ownerId: people.admin.id, kind: "test-sleep-and-count", params: { steps: 2, stepMs: 1 } });
    const held = await queue.enqueue({ workspaceId: ws, ownerId: people.admin.id, kind: "test-sleep-and-count", params: { steps: 2, stepMs: 1 } });
    const idle = createJobRunner({ db: t.db, computes: TEST_COMPUTES, workers: 1 });
    expect(await deadClaim(job.id)).not.toBeNull();
    expect(await liveClaim(held.id)).not.toBeNull();

    const first = await idle.recover();
    expect(first.requeued).toEqual([job.id]);
    let row = await get(job.id);
    expect(row.status).toBe("queued");
    expect(row.attempts).toBe(1);
    expect(row.currentItem).toBe("re-queued: its worker stopped before the job finished");
    expect((await get(held.id)).status).toBe("running");

    expect(await deadClaim(job.id)).not.toBeNull();
    const second = await idle.recover();
    expect(second.failed).toEqual([job.id]);
    row = await get(job.id);
    expect(row.status).toBe("failed");
    expect(row.error).toBe("its worker stopped 2 times before the job finished (lease expired); not retried again");

    const waiting = await queue.enqueue({ workspaceId: ws, ownerId: people.curator.id, kind: "test-sleep-and-count", params: { steps: 2, stepMs: 1 } });
    const interrupted = await queue.enqueue({ workspaceId: ws, ownerId: people.curator.id, kind: "test-sleep-and-count", params: { steps: 2, stepMs: 1 } });
    await deadClaim(interrupted.id);
    await idle.start();
    await idle.drain();
    expect((await get(waiting.id)).status).toBe("succeeded");
    const rerun = await get(interrupted.id);
    expect(rerun.status).toBe("succeeded");
    expect(rerun.attempts).toBe(2);
    // The live runner's job was never touched by the other runner.
    const stillHeld = await get(held.id);
    expect(stillHeld.status).toBe("running");
    expect(stillHeld.attempts).toBe(1);
    await t.db.update(jobs).set({ status: "cancelled" }).where(eq(jobs.id, held.id));
    await idle.stop();
    runner = createJobRunner({ db: t.db, computes: TEST_COMPUTES, workers: 1 });
  });

  it("cancels a queued job at once, before any runner claims it", async () => {
    const job = await queue.enqueue({ workspaceId: ws, ownerId: people.contributor.id, kind: "test-sleep-and-count", params: { steps: 2, stepMs: 1 } });
    const cancelled = await queue.cancel({ jobId: job.id, workspaceId: ws, actor: { userId: people.contributor.id, role: "contributor" } });
    expect(cancelled.status).toBe("cancelled");
    expect(cancelled.error).toBe("cancelled before it started");
    expect(cancelled.attempts).toBe(0);
    const again = await queue.cancel({ jobId: job.id, workspaceId: ws, actor: { userId: people.contributor.id, role: "contributor" } });
    expect(again.finishedAt).toBe(cancelled.finishedAt);
  });
});
