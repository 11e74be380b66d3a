import { and, asc, count, desc, eq, inArray, isNull, lt, or, sql } from "drizzle-orm";
import { jobs, type Job, type JOB_LANES } from "@/db/schema";
import { type Executor, getDatabase, withDb } from "./connection";
import { decodeCursor, encodeCursor } from "./cursor";

export const ACTIVE_JOB_STATUSES = ["queued", "running"] as const;
type FinishedStatus = "succeeded" | "failed" | "cancelled";

export type JobLane = (typeof JOB_LANES)[number];
export type CreateJobResult = { ok: true; job: Job } | { ok: false; active: number };

/**
 * Inserts a queued job unless its owner already has `limit` queued or running jobs. The count and
 * the insert share one write transaction (BEGIN IMMEDIATE under libSQL), so two requests at once
 * cannot both slip under the bound.
 */
export async function createJobWithinLimit(
  {
    db = getDatabase(),
    ...input
  }: { db?: Executor } & { workspaceId: string; ownerId: string; kind: string; params: unknown; limit: number; lane?: JobLane },
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
        lane: input.lane ?? "large",
      })
      .returning();
    return { ok: true as const, job };
  }));
}

/** Queued or running jobs of a workspace and of one person in it (BullMQ priorities are made from them). */
export async function countActiveJobs(
  { db = getDatabase(), ...input }: { db?: Executor } & { workspaceId: string; ownerId: string | null },
): Promise<{ workspace: number; owner: number }> {
  const active = inArray(jobs.status, ACTIVE_JOB_STATUSES);
  const [[workspace], [owner]] = await Promise.all([
    db.select({ n: count() }).from(jobs).where(and(eq(jobs.workspaceId, input.workspaceId), active)),
    db.select({ n: count() }).from(jobs).where(and(eq(jobs.ownerId, input.ownerId ?? ""), active)),
  ]);
  return { workspace: workspace.n, owner: owner.n };
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

export type JobSlot = Pick<Job, "id" | "workspaceId" | "ownerId" | "lane" | "createdAt">;

/** What fair scheduling looks at: the oldest queued jobs, and every running job of every runner. */
export async function listJobQueueState(
  { db = getDatabase(), ...input }: { db?: Executor } & { queuedLimit: number },
): Promise<{ queued: JobSlot[]; running: JobSlot[] }> {
  const slot = { id: jobs.id, workspaceId: jobs.workspaceId, ownerId: jobs.ownerId, lane: jobs.lane, createdAt: jobs.createdAt };
  const [queued, running] = await Promise.all([
    db.select(slot).from(jobs).where(eq(jobs.status, "queued")).orderBy(asc(jobs.createdAt), asc(jobs.id)).limit(input.queuedLimit),
    db.select(slot).from(jobs).where(eq(jobs.status, "running")),
  ]);
  return { queued, running };
}

/**
 * Jobs that should be somewhere in a queue but are held by no runner: queued since before
 * `queuedBefore`, or running under a lapsed lease. Oldest first (the BullMQ sweep checks each).
 */
export async function listUnheldJobs(
  { db = getDatabase(), ...input }: { db?: Executor } & { queuedBefore: Date; now?: Date; limit: number },
): Promise<Job[]> {
  const now = input.now ?? new Date();
  return db
    .select()
    .from(jobs)
    .where(
      or(
        and(eq(jobs.status, "queued"), lt(jobs.createdAt, input.queuedBefore)),
        and(eq(jobs.status, "running"), leaseLapsed(now)),
      ),
    )
    .orderBy(asc(jobs.createdAt), asc(jobs.id))
    .limit(input.limit);
}

export type Lease = { owner: string; leaseMs: number; now?: Date };

const leaseUntil = (lease: Lease) => new Date((lease.now ?? new Date()).getTime() + lease.leaseMs);
/** A running job whose holder stopped renewing (or that was claimed before leases existed). */
const leaseLapsed = (now: Date) => or(isNull(jobs.leaseExpiresAt), lt(jobs.leaseExpiresAt, now));

/**
 * Moves one job from queued to running under a lease held by `owner`, and counts the attempt.
 * Returns null when another runner (or a cancel) got there first: the status condition makes the
 * claim atomic.
 */
export async function claimJob({ db = getDatabase(), ...input }: { db?: Executor } & { id: string } & Lease): Promise<Job | null> {
  const now = input.now ?? new Date();
  const [row] = await db
    .update(jobs)
    .set({ status: "running", attempts: sql`${jobs.attempts} + 1`, startedAt: now, error: null, leaseOwner: input.owner, leaseExpiresAt: leaseUntil(input) })
    .where(and(eq(jobs.id, input.id), eq(jobs.status, "queued")))
    .returning();
  return row ?? null;
}

/**
 * Takes over a running job whose lease has lapsed (its runner died), as a new attempt. Returns null
 * when the job is not running or its lease is still held.
 */
export async function takeOverLapsedJob({ db = getDatabase(), ...input }: { db?: Executor } & { id: string } & Lease): Promise<Job | null> {
  const now = input.now ?? new Date();
  const [row] = await db
    .update(jobs)
    .set({ attempts: sql`${jobs.attempts} + 1`, startedAt: now, progress: 0, leaseOwner: input.owner, leaseExpiresAt: leaseUntil(input) })
    .where(and(eq(jobs.id, input.id), eq(jobs.status, "running"), leaseLapsed(now)))
    .returning();
  return row ?? null;
}

/** The heartbeat: extends the leases `owner` still holds among `ids`, and returns those ids. */
export async function renewJobLeases({ db = getDatabase(), ...input }: { db?: Executor } & { ids: string[] } & Lease): Promise<string[]> {
  if (input.ids.length === 0) return [];
  const rows = await db
    .update(jobs)
    .set({ leaseExpiresAt: leaseUntil(input) })
    .where(and(inArray(jobs.id, input.ids), eq(jobs.status, "running"), eq(jobs.leaseOwner, input.owner)))
    .returning({ id: jobs.id });
  return rows.map((r) => r.id);
}

/** Only the holder of the lease writes to a running job (a runner that lost it writes nothing). */
const heldBy = (owner: string | undefined) => (owner === undefined ? undefined : eq(jobs.leaseOwner, owner));

export async function updateJobProgress(
  { db = getDatabase(), ...input }: { db?: Executor } & { id: string; progress: number; currentItem: string | null; owner?: string },
): Promise<void> {
  await db
    .update(jobs)
    .set({ progress: Math.min(1, Math.max(0, input.progress)), currentItem: input.currentItem })
    .where(and(eq(jobs.id, input.id), eq(jobs.status, "running"), heldBy(input.owner)));
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
    /** The lease holder; when given, a job held by another runner (or queued again) is left alone. */
    owner?: string;
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
      leaseExpiresAt: null,
    })
    .where(
      input.owner === undefined
        ? and(eq(jobs.id, input.id), inArray(jobs.status, ACTIVE_JOB_STATUSES))
        : and(eq(jobs.id, input.id), eq(jobs.status, "running"), heldBy(input.owner)),
    )
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

/** The reason a job fails with once its runner has died `attempts` times under it. */
export function lapsedJobError(attempts: number): string {
  return `its worker stopped ${attempts} times before the job finished (lease expired); not retried again`;
}
export const REQUEUED_ITEM = "re-queued: its worker stopped before the job finished";

/** Fails one running job whose lease lapsed (its worker died and it is not to be retried); null if it was not. */
export async function failLapsedJob({ db = getDatabase(), ...input }: { db?: Executor } & { id: string; now?: Date }): Promise<Job | null> {
  const now = input.now ?? new Date();
  const [row] = await db
    .update(jobs)
    .set({ status: "failed", finishedAt: now, error: sql`'its worker stopped ' || ${jobs.attempts} || ' times before the job finished (lease expired); not retried again'`, leaseOwner: null, leaseExpiresAt: null })
    .where(and(eq(jobs.id, input.id), eq(jobs.status, "running"), leaseLapsed(now)))
    .returning();
  return row ?? null;
}

/**
 * Running jobs whose lease lapsed belong to a runner that died (or stalled past its lease): a job
 * with attempts left goes back to the queue, one that was already re-run fails with a reason (a job
 * that kills its process cannot loop forever), and one whose cancel was asked is cancelled.
 * Every update re-checks the lapse, so a runner renewing at that moment keeps its job.
 */
export async function recoverLapsedJobs(
  { db = getDatabase(), ...input }: { db?: Executor } & { maxAttempts: number; now?: Date },
): Promise<{ requeued: string[]; failed: string[]; cancelled: string[] }> {
  const now = input.now ?? new Date();
  const lapsed = await db.select().from(jobs).where(and(eq(jobs.status, "running"), leaseLapsed(now)));
  const out = { requeued: [] as string[], failed: [] as string[], cancelled: [] as string[] };
  for (const job of lapsed) {
    const where = and(eq(jobs.id, job.id), eq(jobs.status, "running"), leaseLapsed(now));
    const [outcome, set] = job.cancelRequested
      ? (["cancelled", { status: "cancelled", finishedAt: now, error: "cancelled; its worker stopped before the job did" }] as const)
      : job.attempts < input.maxAttempts
        ? (["requeued", { status: "queued", progress: 0, currentItem: REQUEUED_ITEM }] as const)
        : (["failed", { status: "failed", finishedAt: now, error: lapsedJobError(job.attempts) }] as const);
    const changed = await db
      .update(jobs)
      .set({ ...set, leaseOwner: null, leaseExpiresAt: null })
      .where(where)
      .returning({ id: jobs.id });
    if (changed.length > 0) out[outcome].push(job.id);
  }
  return out;
}
