import { authorize, resolveActor } from "@/app/api/_lib/actor";
import { parseBody, parseQuery, route } from "@/app/api/_lib/handler";
import { listAnnotations } from "@/db/queries/notes";
import { ANNOTATION_ACTION, annotate } from "@/server/team/annotations";
import { AnnotationBody, AnnotationQuery } from "./schema";

/** GET /api/annotations?subjectType=map&subjectId=…. */
export const GET = route(async (request) => {
  const q = parseQuery(request, AnnotationQuery);
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  const items = await listAnnotations({ workspaceId: actor.workspace.id, ...q });
  return Response.json({ items: items.map((a) => ({ ...a, createdAt: a.createdAt.toISOString() })) });
});

/** POST /api/annotations `{ subjectType, subjectId, kind, text }`. */
export const POST = route(async (request) => {
  const body = await parseBody(request, AnnotationBody);
  const actor = await resolveActor(request);
  authorize(actor, ANNOTATION_ACTION[body.kind]);
  const row = await annotate({ workspaceId: actor.workspace.id, authorId: actor.user.id, ...body });
  return Response.json(row, { status: 201 });
});
