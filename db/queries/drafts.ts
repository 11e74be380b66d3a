import "server-only";
import { and, desc, eq, or, sql } from "drizzle-orm";
import { drafts, users, type Draft } from "@/db/schema";
import { getDatabase, withDb, type Executor } from "./connection";

/** A draft with its owner's name, as the lists show it. */
export type DraftRow = Draft & { ownerName: string };

const columns = {
  id: drafts.id,
  workspaceId: drafts.workspaceId,
  ownerId: drafts.ownerId,
  name: drafts.name,
  body: drafts.body,
  shared: drafts.shared,
  createdAt: drafts.createdAt,
  updatedAt: drafts.updatedAt,
  ownerName: users.name,
};

export async function createDraft({
  db = getDatabase(),
  workspaceId,
  ownerId,
  name,
  body,
}: {
  db?: Executor;
  workspaceId: string;
  ownerId: string;
  name: string;
  body: string;
}): Promise<Draft> {
  return withDb("storing a draft", async () => {
    const [row] = await db.insert(drafts).values({ workspaceId, ownerId, name, body }).returning();
    return row;
  });
}

/** A draft the person may see: their own, or one shared with the workspace; null otherwise. */
export async function getVisibleDraft({
  db = getDatabase(),
  workspaceId,
  userId,
  draftId,
}: {
  db?: Executor;
  workspaceId: string;
  userId: string;
  draftId: string;
}): Promise<DraftRow | null> {
  return withDb("reading a draft", async () => {
    const row = await db
      .select(columns)
      .from(drafts)
      .innerJoin(users, eq(users.id, drafts.ownerId))
      .where(and(eq(drafts.id, draftId), eq(drafts.workspaceId, workspaceId), or(eq(drafts.ownerId, userId), eq(drafts.shared, true))))
      .get();
    return row ?? null;
  });
}

/** The person's own drafts and those shared with the workspace, most recently changed first. */
export async function listVisibleDrafts({
  db = getDatabase(),
  workspaceId,
  userId,
  limit = 50,
}: {
  db?: Executor;
  workspaceId: string;
  userId: string;
  limit?: number;
}): Promise<DraftRow[]> {
  return withDb("listing drafts", () =>
    db
      .select(columns)
      .from(drafts)
      .innerJoin(users, eq(users.id, drafts.ownerId))
      .where(and(eq(drafts.workspaceId, workspaceId), or(eq(drafts.ownerId, userId), eq(drafts.shared, true))))
      .orderBy(desc(drafts.updatedAt))
      .limit(limit)
      .all(),
  );
}

/** Changes the owner's draft; null when it is not theirs (nothing is written). */
export async function updateDraft({
  db = getDatabase(),
  workspaceId,
  ownerId,
  draftId,
  patch,
}: {
  db?: Executor;
  workspaceId: string;
  ownerId: string;
  draftId: string;
  patch: { name?: string; body?: string; shared?: boolean };
}): Promise<Draft | null> {
  return withDb("saving a draft", async () => {
    const [row] = await db
      .update(drafts)
      .set({ ...patch, updatedAt: sql`(unixepoch('subsec') * 1000)` })
      .where(and(eq(drafts.id, draftId), eq(drafts.workspaceId, workspaceId), eq(drafts.ownerId, ownerId)))
      .returning();
    return row ?? null;
  });
}

/** Deletes the owner's draft; false when it is not theirs. */
export async function deleteDraft({
  db = getDatabase(),
  workspaceId,
  ownerId,
  draftId,
}: {
  db?: Executor;
  workspaceId: string;
  ownerId: string;
  draftId: string;
}): Promise<boolean> {
  return withDb("deleting a draft", async () => {
    const gone = await db
      .delete(drafts)
      .where(and(eq(drafts.id, draftId), eq(drafts.workspaceId, workspaceId), eq(drafts.ownerId, ownerId)))
      .returning({ id: drafts.id });
    return gone.length > 0;
  });
}
