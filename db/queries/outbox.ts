import "server-only";
import { and, asc, desc, eq, sql, type SQL } from "drizzle-orm";
import { notificationOutbox, type OutboxMessage } from "@/db/schema";
import { type Executor, getDatabase, withDb } from "./connection";

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

export async function markOutboxSent({ db = getDatabase(), id, now = new Date() }: { db?: Executor; id: string; now?: Date }): Promise<void> {
  await withDb("recording a sent message", () =>
    db
      .update(notificationOutbox)
      .set({ status: "sent", sentAt: now, attempts: sql`${notificationOutbox.attempts} + 1`, lastError: null })
      .where(and(eq(notificationOutbox.id, id), eq(notificationOutbox.status, "pending"))),
  );
}

/**
 * Counts a failed delivery; after `maxAttempts` the message is given up as failed (it stays in the
 * table with its last error, for an admin to see).
 */
export async function recordOutboxFailure({
  db = getDatabase(),
  id,
  error,
  maxAttempts,
}: {
  db?: Executor;
  id: string;
  error: string;
  maxAttempts: number;
}): Promise<OutboxMessage | null> {
  return withDb("recording a failed delivery", async () => {
    const [row] = await db
      .update(notificationOutbox)
      .set({
        attempts: sql`${notificationOutbox.attempts} + 1`,
        lastError: error.slice(0, 500),
        status: sql`case when ${notificationOutbox.attempts} + 1 >= ${maxAttempts} then 'failed' else 'pending' end`,
      })
      .where(and(eq(notificationOutbox.id, id), eq(notificationOutbox.status, "pending")))
      .returning();
    return row ?? null;
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
