import { createDraft, getVisibleDraft } from "@/db/queries/drafts";
import { AppError } from "@/server/errors";
import { authorize, resolveActor } from "../../../_lib/actor";
import { parseParams, route } from "../../../_lib/handler";
import { draftJson } from "../../draft-json";
import { Params } from "../../schema";

export const POST = route<{ id: string }>(async (request, { params }) => {
  const { id } = await parseParams(params, Params);
  const actor = await resolveActor(request);
  authorize(actor, "chain:submit");
  const source = await getVisibleDraft({ workspaceId: actor.workspace.id, userId: actor.user.id, draftId: id });
  if (!source) throw new AppError("not_found", `No draft ${id} that you can see.`, { field: "id" });
  const copy = await createDraft({ workspaceId: actor.workspace.id, ownerId: actor.user.id, name: `Copy of ${source.name}`.slice(0, 200), body: source.body });
  return Response.json(draftJson({ ...copy, ownerName: actor.user.name }, actor.user.id, true), { status: 201 });
});
