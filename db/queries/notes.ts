import "server-only";
import { and, count, desc, eq } from "drizzle-orm";
import { auditEvents, users } from "../schema";
import { getDatabase, withDb, type Executor } from "./connection";

/** Notes are lines in the workspace's audit log, so they sit in the same timeline as certified maps. */
export const NOTE_ACTION = "note:post";

export type ActivityItem = {
  id: string;
  action: string;
  subjectType: string;
  subjectId: string;
  detail: Record<string, unknown>;
  actorName: string | null;
  createdAt: Date;
};

export async function createNote(
  { workspaceId, actorId, text }: { workspaceId: string; actorId: string; text: string },
  db: Executor = getDatabase(),
): Promise<{ id: string }> {
  return withDb("saving a note", async () => {
    const [row] = await db
      .insert(auditEvents)
      .values({
        workspaceId,
        actorId,
        action: NOTE_ACTION,
        subjectType: "workspace",
        subjectId: workspaceId,
        detail: JSON.stringify({ text }),
      })
      .returning({ id: auditEvents.id });
    return row;
  });
}

export async function countNotes({ workspaceId }: { workspaceId: string }, db: Executor = getDatabase()): Promise<number> {
  return withDb("counting notes", async () => {
    const [row] = await db
      .select({ n: count() })
      .from(auditEvents)
      .where(and(eq(auditEvents.workspaceId, workspaceId), eq(auditEvents.action, NOTE_ACTION)));
    return row?.n ?? 0;
  });
}

/** The newest events of a workspace (notes, certified maps, retractions …) with the actor's name. */
export async function listActivity(
  { workspaceId, limit = 20 }: { workspaceId: string; limit?: number },
  db: Executor = getDatabase(),
): Promise<ActivityItem[]> {
  return withDb("reading the activity log", async () => {
    const rows = await db
      .select({
        id: auditEvents.id,
        action: auditEvents.action,
        subjectType: auditEvents.subjectType,
        subjectId: auditEvents.subjectId,
        detail: auditEvents.detail,
        actorName: users.name,
        createdAt: auditEvents.createdAt,
      })
      .from(auditEvents)
      .leftJoin(users, eq(users.id, auditEvents.actorId))
      .where(eq(auditEvents.workspaceId, workspaceId))
      .orderBy(desc(auditEvents.createdAt))
      .limit(limit);
    return rows.map((r) => ({ ...r, detail: parseDetail(r.detail) }));
  });
}

function parseDetail(text: string): Record<string, unknown> {
  try {
    const value: unknown = JSON.parse(text);
    return value && typeof value === "object" && !Array.isArray(value) ? (value as Record<string, unknown>) : {};
  } catch {
    return {};
  }
}
