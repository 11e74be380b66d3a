import "server-only";
import { and, asc, eq, sql } from "drizzle-orm";
import { models, watches, type Watch } from "@/db/schema";
import { type Executor, getDatabase, withDb } from "./connection";

/** One person and one model of a workspace: what every watch query is about. */
type WatchTarget = { db?: Executor; workspaceId: string; userId: string; modelId: string };

/** Starts watching a model of the workspace; watching twice is the same watch. Returns null when the model is not in the workspace. */
export async function watchModel({
  db = getDatabase(),
  workspaceId,
  userId,
  modelId,
}: WatchTarget): Promise<Watch | null> {
  return withDb("watching a model", async () => {
    const [model] = await db
      .select({ id: models.id })
      .from(models)
      .where(and(eq(models.id, modelId), eq(models.workspaceId, workspaceId)))
      .limit(1);
    if (!model) return null;
    await db.insert(watches).values({ workspaceId, userId, modelId }).onConflictDoNothing();
    const [row] = await db
      .select()
      .from(watches)
      .where(and(eq(watches.userId, userId), eq(watches.modelId, modelId)))
      .limit(1);
    return row ?? null;
  });
}

/** Stops watching; returns whether a watch existed. */
export async function unwatchModel({
  db = getDatabase(),
  workspaceId,
  userId,
  modelId,
}: WatchTarget): Promise<boolean> {
  return withDb("unwatching a model", async () => {
    const removed = await db
      .delete(watches)
      .where(and(eq(watches.workspaceId, workspaceId), eq(watches.userId, userId), eq(watches.modelId, modelId)))
      .returning({ id: watches.id });
    return removed.length > 0;
  });
}

/** Whether the user watches the model, and how many people do. */
export async function getWatchState({
  db = getDatabase(),
  workspaceId,
  userId,
  modelId,
}: WatchTarget): Promise<{ watching: boolean; watchers: number }> {
  return withDb("reading watchers", async () => {
    const [row] = await db
      .select({
        watchers: sql<number>`count(*)`,
        watching: sql<number>`coalesce(sum(${watches.userId} = ${userId}), 0)`,
      })
      .from(watches)
      .where(and(eq(watches.workspaceId, workspaceId), eq(watches.modelId, modelId)));
    return { watching: Number(row?.watching ?? 0) > 0, watchers: Number(row?.watchers ?? 0) };
  });
}

/** The models a user watches in a workspace, oldest watch first. */
export async function listWatchedModels({
  db = getDatabase(),
  workspaceId,
  userId,
}: {
  db?: Executor;
  workspaceId: string;
  userId: string;
}): Promise<{ modelId: string; name: string; kind: string; since: Date }[]> {
  return withDb("listing watched models", () =>
    db
      .select({ modelId: models.id, name: models.name, kind: models.kind, since: watches.createdAt })
      .from(watches)
      .innerJoin(models, eq(models.id, watches.modelId))
      .where(and(eq(watches.workspaceId, workspaceId), eq(watches.userId, userId)))
      .orderBy(asc(watches.createdAt)),
  );
}
