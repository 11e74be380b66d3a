import { and, asc, desc, eq, inArray, lt, or, sql } from "drizzle-orm";
import { jobs, type Job } from "@/db/schema";
import { type Executor, getDatabase, withDb } from "./connection";
import { decodeCursor, encodeCursor } from "./cursor";

export const ACTIVE_JOB_STATUSES = ["queued", "running"] as const;
type FinishedStatus = "succeeded" | "failed" | "cancelled";

export type CreateJobResult = { ok: true; job: Job } | { ok: false; active: number };

/**
 * Inserts a queued job unless its owner already has `limit` queued or running jobs. The count and
 * the insert share one write transaction (BEGIN IMMEDIATE under libSQL), so two requests at once
 * cannot both slip under the bound.
 */
export async function createJobWithinLimit(
  { db = getDatabase(), ...input }: { db?: Executor } & { workspaceId: string; ownerId: string; kind: string; params: unknown; limit: number },
): Promise<CreateJobResult> {
  return withDb("queueing a job", () => db.transaction(async (tx) => {
    const [{ active }] = await tx
      .select({ active: sql<number>`count(*)` })
      .from(jobs)
      .where(and(eq(jobs.ownerId, input.ownerId), inArray(jobs.status, ACTIVE_JOB_STATUSES)));
    if (active >= input.limit) return { ok: false as const, active };
    const [job] = await tx
      .insert(jobs)
      .values({
        workspaceId: input.workspaceId,
        ownerId: input.ownerId,
        kind: input.kind,
        params: JSON.stringify(input.params),
      })
      .returning();
    return { ok: true as const, job };
  }));
}

export async function getJob({ db = getDatabase(), ...input }: { db?: Executor } & { id: string; workspaceId?: string }): Promise<Job | null> {
  const where = input.workspaceId ? and(eq(jobs.id, input.id), eq(jobs.workspaceId, input.workspaceId)) : eq(jobs.id, input.id);
  const [row] = await withDb("reading a job", () => db.select().from(jobs).where(where).limit(1));
  return row ?? null;
}

/** Newest first, paginated by an opaque cursor (the sort key of the previous page's last row). */
export async function listJobs(
  {
    db = getDatabase(),
    ...input
  }: { db?: Executor } & { workspaceId: string; ownerId?: string; kind?: string; status?: Job["status"]; cursor?: string | null; limit?: number },
): Promise<{ items: Job[]; nextCursor: string | null }> {
  const limit = input.limit ?? 20;
  const conditions = [eq(jobs.workspaceId, input.workspaceId)];
  if (input.ownerId) conditions.push(eq(jobs.ownerId, input.ownerId));
  if (input.kind) conditions.push(eq(jobs.kind, input.kind));
  if (input.status) conditions.push(eq(jobs.status, input.status));
  if (input.cursor) {
    const [ms, id] = decodeCursor(input.cursor, 2);
    const at = new Date(Number(ms));
    const before = or(lt(jobs.createdAt, at), and(eq(jobs.createdAt, at), lt(jobs.id, String(id))));
    if (before) conditions.push(before);
  }
  const rows = await withDb("listing jobs", () =>
    db
      .select()
      .from(jobs)
      .where(and(...conditions))
      .orderBy(desc(jobs.createdAt), desc(jobs.id))
      .limit(limit + 1),
  );
  const items = rows.slice(0, limit);
  const last = items[items.length - 1];
  const nextCursor = rows.length > limit && last ? encodeCursor([last.createdAt.getTime(), last.id]) : null;
  return { items, nextCursor };
}

/** Oldest queued jobs first (FIFO), at most `limit`. */
export async function listQueuedJobs({ db = getDatabase(), ...input }: { db?: Executor } & { limit: number }): Promise<Job[]> {
  return db.select().from(jobs).where(eq(jobs.status, "queued")).orderBy(asc(jobs.createdAt), asc(jobs.id)).limit(input.limit);
}

/**
 * Moves one job from queued to running and counts the attempt. Returns null when another runner
 * (or a cancel) got there first: the status condition makes the claim atomic.
 */
export async function claimJob({ db = getDatabase(), ...input }: { db?: Executor } & { id: string; now?: Date }): Promise<Job | null> {
  const [row] = await db
    .update(jobs)
    .set({ status: "running", attempts: sql`${jobs.attempts} + 1`, startedAt: input.now ?? new Date(), error: null })
    .where(and(eq(jobs.id, input.id), eq(jobs.status, "queued")))
    .returning();
  return row ?? null;
}

export async function updateJobProgress(
  { db = getDatabase(), ...input }: { db?: Executor } & { id: string; progress: number; currentItem: string | null },
): Promise<void> {
  await db
    .update(jobs)
    .set({ progress: Math.min(1, Math.max(0, input.progress)), currentItem: input.currentItem })
    .where(and(eq(jobs.id, input.id), eq(jobs.status, "running")));
}

/** Records the end of a running job; a job already finished (e.g. cancelled while queued) is left alone. */
export async function finishJob(
  { db = getDatabase(), ...input }: { db?: Executor } & {
    id: string;
    status: FinishedStatus;
    result?: unknown;
    error?: string | null;
    progress?: number;
    now?: Date;
  },
): Promise<Job | null> {
  const [row] = await db
    .update(jobs)
    .set({
      status: input.status,
      result: input.result === undefined ? null : JSON.stringify(input.result),
      error: input.error ?? null,
      finishedAt: input.now ?? new Date(),
      ...(input.progress === undefined ? {} : { progress: input.progress }),
    })
    .where(and(eq(jobs.id, input.id), inArray(jobs.status, ACTIVE_JOB_STATUSES)))
    .returning();
  return row ?? null;
}

/**
 * A cancel: a queued job is cancelled at once; a running one is flagged and its runner stops it.
 * Returns the row after the change, or null when the job does not exist.
 */
export async function requestJobCancel({ db = getDatabase(), ...input }: { db?: Executor } & { id: string; now?: Date }): Promise<Job | null> {
  return withDb("cancelling a job", () => db.transaction(async (tx) => {
    const [cancelled] = await tx
      .update(jobs)
      .set({ status: "cancelled", cancelRequested: true, finishedAt: input.now ?? new Date(), error: "cancelled before it started" })
      .where(and(eq(jobs.id, input.id), eq(jobs.status, "queued")))
      .returning();
    if (cancelled) return cancelled;
    const [flagged] = await tx
      .update(jobs)
      .set({ cancelRequested: true })
      .where(and(eq(jobs.id, input.id), eq(jobs.status, "running")))
      .returning();
    if (flagged) return flagged;
    const [row] = await tx.select().from(jobs).where(eq(jobs.id, input.id)).limit(1);
    return row ?? null;
  }));
}

/** Ids among `ids` whose cancel was requested (the runner polls this for the jobs it runs). */
export async function listCancelRequested({ db = getDatabase(), ...input }: { db?: Executor } & { ids: string[] }): Promise<string[]> {
  if (input.ids.length === 0) return [];
  const rows = await db
    .select({ id: jobs.id })
    .from(jobs)
    .where(and(inArray(jobs.id, input.ids), eq(jobs.cancelRequested, true)));
  return rows.map((r) => r.id);
}

/**
 * After a restart no job can still be running in this process. A job interrupted once goes back
 * to the queue; one that was already re-queued once (a second start) fails with a reason, so that
 * a job that kills its process cannot loop forever.
 */
export async function recoverInterruptedJobs(
  { db = getDatabase(), ...input }: { db?: Executor } & { maxAttempts: number; now?: Date },
): Promise<{ requeued: string[]; failed: string[]; cancelled: string[] }> {
  return db.transaction(async (tx) => {
    const running = await tx.select().from(jobs).where(eq(jobs.status, "running"));
    const requeued: string[] = [];
    const failed: string[] = [];
    const cancelled: string[] = [];
    for (const job of running) {
      if (job.cancelRequested) {
        await tx
          .update(jobs)
          .set({ status: "cancelled", finishedAt: input.now ?? new Date(), error: "cancelled; the server restarted before it stopped" })
          .where(eq(jobs.id, job.id));
        cancelled.push(job.id);
      } else if (job.attempts < input.maxAttempts) {
        await tx
          .update(jobs)
          .set({ status: "queued", progress: 0, currentItem: "re-queued after a restart interrupted it" })
          .where(eq(jobs.id, job.id));
        requeued.push(job.id);
      } else {
        await tx
          .update(jobs)
          .set({
            status: "failed",
            finishedAt: input.now ?? new Date(),
            error: `interrupted by a server restart ${job.attempts} times; not retried again`,
          })
          .where(eq(jobs.id, job.id));
        failed.push(job.id);
      }
    }
    return { requeued, failed, cancelled };
  });
}
