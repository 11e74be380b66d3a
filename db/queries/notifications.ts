import "server-only";
import { and, asc, count, desc, eq, inArray, isNull, lte, sql } from "drizzle-orm";
import { memberships, notificationOutbox, notifications, users, type Notification } from "../schema";
import { getDatabase, withDb, type Executor } from "./connection";
import { decodeCursor, encodeCursor } from "./cursor";
import { RETRACTION_TITLE } from "./watches";

/**
 * One page of a person's notifications, newest first, forward-only like the app's other lists: the
 * cursor is the (time, id) of the last row shown (db/queries/cursor.ts); a cursor not given out here is a
 * 400 naming `cursor`.
 */
export async function listNotifications({
  db = getDatabase(),
  workspaceId,
  userId,
  limit = 50,
  cursor,
}: {
  db?: Executor;
  workspaceId: string;
  userId: string;
  /** @default 50 */
  limit?: number;
  cursor?: string | null;
}): Promise<{ items: Notification[]; nextCursor: string | null }> {
  const after = cursor ? decodeCursor(cursor, 2) : null;
  return withDb("listing notifications", async () => {
    // The raw stored time, not the Date read back: a default time can carry a fraction of a millisecond.
    const rows = await db
      .select({ row: notifications, at: sql<number>`${notifications.createdAt}` })
      .from(notifications)
      .where(
        and(
          eq(notifications.workspaceId, workspaceId),
          eq(notifications.userId, userId),
          after ? sql`(${notifications.createdAt}, ${notifications.id}) < (${Number(after[0])}, ${String(after[1])})` : undefined,
        ),
      )
      .orderBy(desc(notifications.createdAt), desc(notifications.id))
      .limit(limit + 1);
    const page = rows.slice(0, limit);
    const last = page[page.length - 1];
    return { items: page.map((r) => r.row), nextCursor: rows.length > limit && last ? encodeCursor([last.at, last.row.id]) : null };
  });
}

export async function countUnreadNotifications({ db = getDatabase(), workspaceId, userId }: { db?: Executor; workspaceId: string; userId: string }): Promise<number> {
  return withDb("counting notifications", async () => {
    const [row] = await db
      .select({ n: count() })
      .from(notifications)
      .where(and(eq(notifications.workspaceId, workspaceId), eq(notifications.userId, userId), isNull(notifications.readAt)));
    return row?.n ?? 0;
  });
}

/** Marks the given notifications (or all) of this person read; returns how many changed. */
export async function markNotificationsRead({
  db = getDatabase(),
  workspaceId,
  userId,
  ids,
  now = new Date(),
}: {
  db?: Executor;
  workspaceId: string;
  userId: string;
  ids?: string[];
  now?: Date;
}): Promise<number> {
  return withDb("marking notifications read", async () => {
    const rows = await db
      .update(notifications)
      .set({ readAt: now })
      .where(
        and(
          eq(notifications.workspaceId, workspaceId),
          eq(notifications.userId, userId),
          isNull(notifications.readAt),
          ids ? inArray(notifications.id, ids) : undefined,
        ),
      )
      .returning({ id: notifications.id });
    return rows.length;
  });
}

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** "2 certified results", "2 certified results and 1 retraction": what a digest holds, by its notifications' titles. */
export function digestCounts(titles: string[]): string {
  const retracted = titles.filter((t) => t.startsWith(RETRACTION_TITLE)).length;
  const certified = titles.length - retracted;
  const parts = [certified > 0 ? plural(certified, "certified result", "certified results") : null, retracted > 0 ? plural(retracted, "retraction", "retractions") : null];
  return parts.filter(Boolean).join(" and ");
}

export const DIGEST_PERIOD_MS = 24 * 60 * 60_000;

/**
 * Daily digests: for each member who chose a digest and whose oldest undigested notification is at
 * least a day old, one outbox mail listing them all, and those notifications marked digested, in
 * one transaction (so a digest is never queued twice for the same notifications).
 */
export async function queueDueDigests({
  db = getDatabase(),
  now,
  appUrl,
  unsubscribeLink,
}: {
  db?: Executor;
  now: Date;
  appUrl: string;
  unsubscribeLink: (workspaceId: string, userId: string) => string;
}): Promise<number> {
  return withDb("queueing digests", async () => {
    const cutoff = new Date(now.getTime() - DIGEST_PERIOD_MS);
    const due = await db
      .selectDistinct({ workspaceId: notifications.workspaceId, userId: notifications.userId })
      .from(notifications)
      .innerJoin(memberships, and(eq(memberships.workspaceId, notifications.workspaceId), eq(memberships.userId, notifications.userId)))
      .where(and(isNull(notifications.digestedAt), eq(memberships.mailDelivery, "digest"), lte(notifications.createdAt, cutoff)));
    let queued = 0;
    for (const { workspaceId, userId } of due) {
      const done = await db.transaction(async (tx) => {
        const items = await tx
          .select()
          .from(notifications)
          .where(and(eq(notifications.workspaceId, workspaceId), eq(notifications.userId, userId), isNull(notifications.digestedAt)))
          .orderBy(asc(notifications.createdAt));
        const [person] = await tx.select({ email: users.email }).from(users).where(eq(users.id, userId)).limit(1);
        if (items.length === 0 || !person) return false;
        await tx.update(notifications).set({ digestedAt: now }).where(inArray(notifications.id, items.map((i) => i.id)));
        const unsubscribe = unsubscribeLink(workspaceId, userId);
        const lines = items.map((i) => `- ${i.title}\n  ${appUrl}${i.link}`);
        await tx.insert(notificationOutbox).values({
          workspaceId,
          userId,
          toAddress: person.email,
          subject: `Your daily digest: ${digestCounts(items.map((i) => i.title))}`,
          body: `${lines.join("\n")}\n\nStop these mails with one click: ${unsubscribe}\n`,
          unsubscribeUrl: unsubscribe,
        });
        return true;
      });
      if (done) queued++;
    }
    return queued;
  });
}
