import "server-only";
import { auditEvents } from "@/db/schema";
import type { Executor } from "./connection";

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
