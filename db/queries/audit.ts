import "server-only";
import { and, asc, count, desc, eq, inArray } from "drizzle-orm";
import { alias } from "drizzle-orm/sqlite-core";
import { auditEvents, jobs, maps, models, users } from "@/db/schema";
import { getDatabase, withDb, type Executor } from "./connection";

/** Appends one audit event; callers pass their transaction so the event commits with the change. */
export async function recordAuditEvent({
  db,
  workspaceId,
  actorId,
  action,
  subjectType,
  subjectId,
  detail = {},
}: {
  db: Executor;
  workspaceId: string | null;
  actorId: string | null;
  action: string;
  subjectType: string;
  subjectId: string;
  detail?: Record<string, unknown>;
}): Promise<void> {
  await db.insert(auditEvents).values({ workspaceId, actorId, action, subjectType, subjectId, detail: JSON.stringify(detail) });
}

export type AuditRow = {
  id: string;
  action: string;
  subjectType: string;
  subjectId: string;
  detail: Record<string, unknown>;
  actorId: string | null;
  actorName: string | null;
  createdAt: Date;
};

function parseDetail(text: string): Record<string, unknown> {
  try {
    const value: unknown = JSON.parse(text);
    return value && typeof value === "object" && !Array.isArray(value) ? (value as Record<string, unknown>) : {};
  } catch {
    return {};
  }
}

/** A page of the workspace's audit log, newest first, optionally of one kind of action and one person. */
export async function listAuditEvents({
  db = getDatabase(),
  workspaceId,
  action,
  actorId,
  limit = 50,
  offset = 0,
}: {
  db?: Executor;
  workspaceId: string;
  action?: string;
  actorId?: string;
  limit?: number;
  offset?: number;
}): Promise<{ items: AuditRow[]; total: number }> {
  return withDb("reading the audit log", async () => {
    const where = and(eq(auditEvents.workspaceId, workspaceId), action ? eq(auditEvents.action, action) : undefined, actorId ? eq(auditEvents.actorId, actorId) : undefined);
    const [rows, [{ n }]] = await Promise.all([
      db
        .select({
          id: auditEvents.id,
          action: auditEvents.action,
          subjectType: auditEvents.subjectType,
          subjectId: auditEvents.subjectId,
          detail: auditEvents.detail,
          actorId: auditEvents.actorId,
          actorName: users.name,
          createdAt: auditEvents.createdAt,
        })
        .from(auditEvents)
        .leftJoin(users, eq(users.id, auditEvents.actorId))
        .where(where)
        .orderBy(desc(auditEvents.createdAt), desc(auditEvents.id))
        .limit(limit)
        .offset(offset),
      db.select({ n: count() }).from(auditEvents).where(where),
    ]);
    return { items: rows.map((r) => ({ ...r, detail: parseDetail(r.detail) })), total: n };
  });
}

/** The kinds of action that occur in a workspace's log (for the filter). */
export async function listAuditActions({ db = getDatabase(), workspaceId }: { db?: Executor; workspaceId: string }): Promise<string[]> {
  return withDb("reading the audit log", async () => {
    const rows = await db.selectDistinct({ action: auditEvents.action }).from(auditEvents).where(eq(auditEvents.workspaceId, workspaceId)).orderBy(asc(auditEvents.action));
    return rows.map((r) => r.action);
  });
}

export type MapLine = { id: string; kind: string; block: number | null; steps: number | null; sourceName: string; targetName: string };

const logSource = alias(models, "log_source");
const logTarget = alias(models, "log_target");

/** Names for the maps a log page mentions. */
export async function getMapLines({ db = getDatabase(), workspaceId, mapIds }: { db?: Executor; workspaceId: string; mapIds: string[] }): Promise<Map<string, MapLine>> {
  if (mapIds.length === 0) return new Map();
  return withDb("reading maps for the log", async () => {
    const rows = await db
      .select({ id: maps.id, kind: maps.kind, block: maps.block, steps: maps.steps, sourceName: logSource.name, targetName: logTarget.name })
      .from(maps)
      .innerJoin(logSource, eq(logSource.id, maps.sourceModelId))
      .innerJoin(logTarget, eq(logTarget.id, maps.targetModelId))
      .where(and(eq(maps.workspaceId, workspaceId), inArray(maps.id, mapIds)));
    return new Map(rows.map((r) => [r.id, r]));
  });
}

/** Finished jobs of the workspace that may have written maps, newest first. */
export async function listFinishedJobs({ db = getDatabase(), workspaceId, limit = 50 }: { db?: Executor; workspaceId: string; limit?: number }) {
  return withDb("reading jobs for the log", () =>
    db
      .select({ id: jobs.id, kind: jobs.kind, params: jobs.params, result: jobs.result, ownerId: jobs.ownerId, ownerName: users.name, startedAt: jobs.startedAt, finishedAt: jobs.finishedAt, status: jobs.status })
      .from(jobs)
      .leftJoin(users, eq(users.id, jobs.ownerId))
      .where(and(eq(jobs.workspaceId, workspaceId), inArray(jobs.status, ["succeeded", "failed", "cancelled"])))
      .orderBy(desc(jobs.finishedAt))
      .limit(limit),
  );
}
