import "server-only";
import { and, asc, count, desc, eq } from "drizzle-orm";
import { annotations, auditEvents, maps, models, users, type ANNOTATION_KINDS } from "../schema";
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

export type AnnotationKind = (typeof ANNOTATION_KINDS)[number];
export type AnnotationView = { id: string; kind: AnnotationKind; text: string; authorName: string | null; createdAt: Date };

/**
 * Adds a note, tag or "published in" reference to a model or map of the workspace, with its audit
 * event, in one transaction. Null when the model or map is not in the workspace. A tag already on
 * the record is not added twice.
 */
export async function addAnnotation({
  db = getDatabase(),
  workspaceId,
  subjectType,
  subjectId,
  kind,
  text,
  authorId,
}: {
  db?: Executor;
  workspaceId: string;
  subjectType: "model" | "map";
  subjectId: string;
  kind: AnnotationKind;
  text: string;
  authorId: string;
}): Promise<{ id: string } | null> {
  return withDb("saving a note", () =>
    db.transaction(async (tx) => {
      const table = subjectType === "model" ? models : maps;
      const [subject] = await tx
        .select({ id: table.id })
        .from(table)
        .where(and(eq(table.workspaceId, workspaceId), eq(table.id, subjectId)))
        .limit(1);
      if (!subject) return null;
      const where = and(eq(annotations.workspaceId, workspaceId), eq(annotations.subjectType, subjectType), eq(annotations.subjectId, subjectId), eq(annotations.kind, kind), eq(annotations.text, text));
      if (kind !== "note") {
        const [same] = await tx.select({ id: annotations.id }).from(annotations).where(where).limit(1);
        if (same) return same;
      }
      const [row] = await tx.insert(annotations).values({ workspaceId, subjectType, subjectId, kind, text, authorId }).returning({ id: annotations.id });
      await tx.insert(auditEvents).values({
        workspaceId,
        actorId: authorId,
        action: "annotation:add",
        subjectType,
        subjectId,
        detail: JSON.stringify({ kind, text: text.slice(0, 200), subjectType }),
      });
      return row;
    }),
  );
}

export async function listAnnotations({ db = getDatabase(), workspaceId, subjectType, subjectId }: { db?: Executor; workspaceId: string; subjectType: "model" | "map"; subjectId: string }): Promise<AnnotationView[]> {
  return withDb("reading notes", () =>
    db
      .select({ id: annotations.id, kind: annotations.kind, text: annotations.text, authorName: users.name, createdAt: annotations.createdAt })
      .from(annotations)
      .leftJoin(users, eq(users.id, annotations.authorId))
      .where(and(eq(annotations.workspaceId, workspaceId), eq(annotations.subjectType, subjectType), eq(annotations.subjectId, subjectId)))
      .orderBy(asc(annotations.createdAt)),
  );
}
