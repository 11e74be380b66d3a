import { getMap, retractMap } from "@/db/queries/atlas";
import { AppError } from "@/server/errors";
import { authorize, resolveActor } from "../../../_lib/actor";
import { parseBody, parseParams, route } from "../../../_lib/handler";
import { mapJson } from "../../../_lib/schemas";
import { Body, Params } from "./schema";

export const POST = route<{ id: string }>(async (request, { params }) => {
  const { id } = await parseParams(params, Params);
  const body = await parseBody(request, Body);
  const actor = await resolveActor(request);
  const map = await getMap({ workspaceId: actor.workspace.id, mapId: id });
  if (!map) throw new AppError("not_found", `No map ${id} in this workspace.`, { field: "id" });
  authorize(actor, "map:retract");
  const retracted = await retractMap({ workspaceId: actor.workspace.id, mapId: id, userId: actor.user.id, reason: body.reason });
  return Response.json(mapJson(retracted));
});
