import { deleteDraft, getVisibleDraft, updateDraft } from "@/db/queries/drafts";
import { AppError } from "@/server/errors";
import { authorize, resolveActor } from "../../_lib/actor";
import { parseBody, parseParams, route } from "../../_lib/handler";
import { ownDraft } from "../access";
import { draftJson } from "../draft-json";
import { Params, UpdateDraftBody } from "../schema";

export const GET = route<{ id: string }>(async (request, { params }) => {
  const { id } = await parseParams(params, Params);
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  const draft = await getVisibleDraft({ workspaceId: actor.workspace.id, userId: actor.user.id, draftId: id });
  if (!draft) throw new AppError("not_found", `No draft ${id} that you can see.`, { field: "id" });
  return Response.json(draftJson(draft, actor.user.id, true));
});

export const PATCH = route<{ id: string }>(async (request, { params }) => {
  const { id } = await parseParams(params, Params);
  const body = await parseBody(request, UpdateDraftBody);
  const actor = await resolveActor(request);
  const draft = await ownDraft(actor, id);
  const updated = await updateDraft({
    workspaceId: actor.workspace.id,
    ownerId: actor.user.id,
    draftId: id,
    patch: { name: body.name, shared: body.shared, body: body.canvas ? JSON.stringify(body.canvas) : undefined },
  });
  if (!updated) throw new AppError("not_found", `No draft ${id} that you can see.`, { field: "id" });
  return Response.json(draftJson({ ...updated, ownerName: draft.ownerName }, actor.user.id, false));
});

export const DELETE = route<{ id: string }>(async (request, { params }) => {
  const { id } = await parseParams(params, Params);
  const actor = await resolveActor(request);
  await ownDraft(actor, id);
  await deleteDraft({ workspaceId: actor.workspace.id, ownerId: actor.user.id, draftId: id });
  return Response.json({ deleted: true });
});
