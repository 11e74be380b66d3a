import "server-only";
import { and, asc, desc, eq, inArray, isNull, lte, or, sql, type SQL } from "drizzle-orm";
import { notificationOutbox, type OutboxMessage } from "@/db/schema";
import { type Executor, getDatabase, withDb } from "./connection";

export type NewMail = {
  workspaceId: string | null;
  userId: string | null;
  toAddress: string;
  subject: string;
  body: string;
  mapId?: string | null;
  unsubscribeUrl?: string | null;
};

/** Queues mail; callers pass their transaction so the message commits with the event that caused it. */
export async function enqueueMail({ db = getDatabase(), mail }: { db?: Executor; mail: NewMail | NewMail[] }): Promise<string[]> {
  const rows = Array.isArray(mail) ? mail : [mail];
  if (rows.length === 0) return [];
  const inserted = await db.insert(notificationOutbox).values(rows).returning({ id: notificationOutbox.id });
  return inserted.map((r) => r.id);
}

/** Pending messages, oldest first. */
export async function listPendingOutbox({ db = getDatabase(), limit = 50 }: { db?: Executor; limit?: number } = {}): Promise<OutboxMessage[]> {
  return withDb("reading the outbox", () =>
    db
      .select()
      .from(notificationOutbox)
      .where(eq(notificationOutbox.status, "pending"))
      .orderBy(asc(notificationOutbox.createdAt), asc(notificationOutbox.id))
      .limit(limit),
  );
}

/**
 * Claims up to `limit` pending messages that are due and not leased by anyone else (or whose lease
 * ran out), for `owner` until `now + leaseMs`. One UPDATE … WHERE id IN (SELECT …) statement: SQLite
 * runs it atomically, so two processes never hold the same row at once.
 */
export async function claimDueOutbox({
  db = getDatabase(),
  owner,
  now,
  leaseMs,
  limit = 50,
}: {
  db?: Executor;
  owner: string;
  now: Date;
  leaseMs: number;
  limit?: number;
}): Promise<OutboxMessage[]> {
  return withDb("claiming outbox messages", async () => {
    const o = notificationOutbox;
    const due = db
      .select({ id: o.id })
      .from(o)
      .where(
        and(
          eq(o.status, "pending"),
          or(isNull(o.nextAttemptAt), lte(o.nextAttemptAt, now)),
          or(isNull(o.leaseExpiresAt), lte(o.leaseExpiresAt, now)),
        ),
      )
      .orderBy(asc(o.createdAt), asc(o.id))
      .limit(limit);
    const claimed = await db
      .update(o)
      .set({ leaseOwner: owner, leaseExpiresAt: new Date(now.getTime() + leaseMs) })
      .where(inArray(o.id, due))
      .returning();
    return claimed.sort((a, b) => a.createdAt.getTime() - b.createdAt.getTime() || a.id.localeCompare(b.id));
  });
}

/** Records a sent message (whoever holds the lease now: it was sent either way) and frees the lease. */
export async function markOutboxSent({ db = getDatabase(), id, now = new Date() }: { db?: Executor; id: string; now?: Date }): Promise<void> {
  await withDb("recording a sent message", () =>
    db
      .update(notificationOutbox)
      .set({ status: "sent", sentAt: now, attempts: sql`${notificationOutbox.attempts} + 1`, lastError: null, leaseOwner: null, leaseExpiresAt: null })
      .where(and(eq(notificationOutbox.id, id), eq(notificationOutbox.status, "pending"))),
  );
}

/**
 * Counts a failed delivery by the lease holder: the message is tried again at `retryAt`, or given
 * up as failed when `retryAt` is null (it stays in the table with its last error, for an admin).
 */
export async function recordOutboxFailure({
  db = getDatabase(),
  id,
  owner,
  error,
  retryAt,
}: {
  db?: Executor;
  id: string;
  owner: string;
  error: string;
  retryAt: Date | null;
}): Promise<OutboxMessage | null> {
  return withDb("recording a failed delivery", async () => {
    const [row] = await db
      .update(notificationOutbox)
      .set({
        attempts: sql`${notificationOutbox.attempts} + 1`,
        lastError: error.slice(0, 500),
        status: retryAt ? "pending" : "failed",
        nextAttemptAt: retryAt,
        leaseOwner: null,
        leaseExpiresAt: null,
      })
      .where(and(eq(notificationOutbox.id, id), eq(notificationOutbox.status, "pending"), eq(notificationOutbox.leaseOwner, owner)))
      .returning();
    return row ?? null;
  });
}

/** An admin sends a failed message again: pending, due at once, with a fresh retry schedule. */
export async function resendOutboxMessage({ db = getDatabase(), workspaceId, id }: { db?: Executor; workspaceId: string; id: string }): Promise<boolean> {
  return withDb("re-sending a message", async () => {
    const rows = await db
      .update(notificationOutbox)
      .set({ status: "pending", attempts: 0, nextAttemptAt: null, leaseOwner: null, leaseExpiresAt: null })
      .where(and(eq(notificationOutbox.id, id), eq(notificationOutbox.workspaceId, workspaceId), eq(notificationOutbox.status, "failed")))
      .returning({ id: notificationOutbox.id });
    return rows.length > 0;
  });
}

/** Messages newest first, optionally of one workspace, status or map (admin views and tests). */
export async function listOutboxMessages({
  db = getDatabase(),
  workspaceId,
  status,
  mapId,
  limit = 50,
}: {
  db?: Executor;
  workspaceId?: string;
  status?: OutboxMessage["status"];
  mapId?: string;
  limit?: number;
}): Promise<OutboxMessage[]> {
  const conditions: SQL[] = [];
  if (workspaceId) conditions.push(eq(notificationOutbox.workspaceId, workspaceId));
  if (status) conditions.push(eq(notificationOutbox.status, status));
  if (mapId) conditions.push(eq(notificationOutbox.mapId, mapId));
  return withDb("listing the outbox", () =>
    db
      .select()
      .from(notificationOutbox)
      .where(conditions.length ? and(...conditions) : undefined)
      .orderBy(desc(notificationOutbox.createdAt), desc(notificationOutbox.id))
      .limit(limit),
  );
}
