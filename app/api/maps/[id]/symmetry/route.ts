import { getMap } from "@/db/queries/atlas";
import { submitSymmetricImages } from "@/server/atlas/submit";
import { AppError } from "@/server/errors";
import { authorize, resolveActor } from "../../../_lib/actor";
import { parseParams, route } from "../../../_lib/handler";
import { Params } from "./schema";

export const POST = route<{ id: string }>(async (request, { params }) => {
  const { id } = await parseParams(params, Params);
  const actor = await resolveActor(request);
  const map = await getMap({ workspaceId: actor.workspace.id, mapId: id });
  if (!map) throw new AppError("not_found", `No map ${id} in this workspace.`, { field: "id" });
  authorize(actor, "certificate:submit");
  const result = await submitSymmetricImages({ workspaceId: actor.workspace.id, userId: actor.user.id, mapId: id });
  return Response.json(result);
});
