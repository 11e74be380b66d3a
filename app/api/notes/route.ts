import { countNotes, createNote, listActivity } from "@/db/queries/notes";
import { authorize, resolveActor } from "../_lib/actor";
import { parseBody, route } from "../_lib/handler";
import { CreateBody } from "./schema";

/** GET /api/notes: the workspace log (session or token, like every route). */
export const GET = route(async (request) => {
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  const workspaceId = actor.workspace.id;
  const [items, notes] = await Promise.all([listActivity({ workspaceId, limit: 50 }), countNotes({ workspaceId })]);
  return Response.json({ notes, items: items.map((i) => ({ ...i, createdAt: i.createdAt.toISOString() })) });
});

/** POST /api/notes `{ "text": "…" }`: adds a note; contributors and above. */
export const POST = route(async (request) => {
  const body = await parseBody(request, CreateBody);
  const actor = await resolveActor(request);
  authorize(actor, "note:post");
  const note = await createNote({ workspaceId: actor.workspace.id, actorId: actor.user.id, text: body.text });
  return Response.json(note, { status: 201 });
});
