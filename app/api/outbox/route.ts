import { authorize, resolveActor } from "@/app/api/_lib/actor";
import { parseQuery, route } from "@/app/api/_lib/handler";
import { listOutboxMessages } from "@/db/queries/outbox";
import { OutboxQuery } from "./schema";

/** GET /api/outbox?status=failed (admins): the workspace's own rows, never anyone else's. */
export const GET = route(async (request) => {
  const { status } = parseQuery(request, OutboxQuery);
  const actor = await resolveActor(request);
  authorize(actor, "outbox:manage");
  const rows = await listOutboxMessages({ workspaceId: actor.workspace.id, status, limit: 200 });
  const iso = (d: Date | null) => d?.toISOString() ?? null;
  return Response.json({
    items: rows.map((m) => ({ id: m.id, to: m.toAddress, subject: m.subject, status: m.status, attempts: m.attempts, lastError: m.lastError, nextAttemptAt: iso(m.nextAttemptAt), sentAt: iso(m.sentAt), createdAt: m.createdAt.toISOString() })),
  });
});
