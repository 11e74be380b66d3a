import { createDraft, listVisibleDrafts } from "@/db/queries/drafts";
import { emptyWorkbench } from "@/components/workbench/workbenchState";
import { authorize, resolveActor } from "../_lib/actor";
import { parseBody, route } from "../_lib/handler";
import { draftJson } from "./draft-json";
import { CreateDraftBody } from "./schema";

export const GET = route(async (request) => {
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  const items = await listVisibleDrafts({ workspaceId: actor.workspace.id, userId: actor.user.id });
  return Response.json({ items: items.map((d) => draftJson(d, actor.user.id, false)) });
});

export const POST = route(async (request) => {
  const body = await parseBody(request, CreateDraftBody);
  const actor = await resolveActor(request);
  authorize(actor, "chain:submit");
  const draft = await createDraft({
    workspaceId: actor.workspace.id,
    ownerId: actor.user.id,
    name: body.name,
    body: JSON.stringify(body.canvas ?? emptyWorkbench),
  });
  return Response.json(draftJson({ ...draft, ownerName: actor.user.name }, actor.user.id, true), { status: 201 });
});
