import { authorize, resolveActor } from "@/app/api/_lib/actor";
import { parseQuery, route } from "@/app/api/_lib/handler";
import { getMapLines, listAuditEvents } from "@/db/queries/audit";
import { describeEvent } from "@/server/team/log";
import { AuditQuery } from "./schema";

/** GET /api/audit?action=map:create&actorId=…&page=2 (admins). */
export const GET = route(async (request) => {
  const q = parseQuery(request, AuditQuery);
  const actor = await resolveActor(request);
  authorize(actor, "audit:browse");
  const { items, total } = await listAuditEvents({ workspaceId: actor.workspace.id, action: q.action, actorId: q.actorId, limit: q.limit, offset: (q.page - 1) * q.limit });
  const names = await getMapLines({ workspaceId: actor.workspace.id, mapIds: items.filter((e) => e.subjectType === "map").map((e) => e.subjectId) });
  return Response.json({
    page: q.page,
    total,
    items: items.map((e) => ({ id: e.id, action: e.action, text: describeEvent(e, names.get(e.subjectId)).text, actorId: e.actorId, actorName: e.actorName, subjectType: e.subjectType, subjectId: e.subjectId, createdAt: e.createdAt.toISOString() })),
  });
});
