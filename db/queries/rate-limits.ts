import "server-only";
import { eq, sql } from "drizzle-orm";
import { rateLimits } from "@/db/schema";
import { type Executor, getDatabase, withDb } from "./connection";

export type RateLimitHit = { count: number; windowStart: Date };

/**
 * Counts one attempt against `key` in a fixed window of `windowMs` and returns the count so far.
 * One statement (an upsert with RETURNING), so that two processes on the same database never lose
 * a count; a window that has passed starts again at 1.
 */
export async function countAttempt({
  db = getDatabase(),
  key,
  windowMs,
  now = new Date(),
}: {
  db?: Executor;
  key: string;
  windowMs: number;
  now?: Date;
}): Promise<RateLimitHit> {
  return withDb("counting an attempt", async () => {
    const at = now.getTime();
    const expired = sql`${rateLimits.windowStart} <= ${at - windowMs}`;
    const [row] = await db
      .insert(rateLimits)
      .values({ key, count: 1, windowStart: now })
      .onConflictDoUpdate({
        target: rateLimits.key,
        set: {
          count: sql`CASE WHEN ${expired} THEN 1 ELSE ${rateLimits.count} + 1 END`,
          windowStart: sql`CASE WHEN ${expired} THEN ${at} ELSE ${rateLimits.windowStart} END`,
        },
      })
      .returning({ count: rateLimits.count, windowStart: rateLimits.windowStart });
    // Now and then, forget counters whose window ended a day ago, so the table stays small.
    if (Math.random() < 0.01) await db.delete(rateLimits).where(sql`${rateLimits.windowStart} < ${at - DAY_MS}`);
    return row;
  });
}

const DAY_MS = 24 * 60 * 60_000;

/** Takes one attempt back from `key` (never below zero). */
export async function refundCount({ db = getDatabase(), key }: { db?: Executor; key: string }): Promise<void> {
  await withDb("refunding an attempt", async () => {
    await db
      .update(rateLimits)
      .set({ count: sql`max(${rateLimits.count} - 1, 0)` })
      .where(eq(rateLimits.key, key));
  });
}
