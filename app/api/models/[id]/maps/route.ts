import { getModel, listMapsFrom, listMapsTo } from "@/db/queries/atlas";
import { AppError } from "@/server/errors";
import { authorize, resolveActor } from "../../../_lib/actor";
import { parseParams, parseQuery, route } from "../../../_lib/handler";
import { mapJson } from "../../../_lib/schemas";
import { Params, Query } from "./schema";

export const GET = route<{ id: string }>(async (request, { params }) => {
  const { id } = await parseParams(params, Params);
  const query = parseQuery(request, Query);
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  const model = await getModel({ workspaceId: actor.workspace.id, idOrAddress: id });
  if (!model) throw new AppError("not_found", `No model ${id} in this workspace.`, { field: "id" });
  const list = query.direction === "from" ? listMapsFrom : listMapsTo;
  const page = await list({ workspaceId: actor.workspace.id, modelId: model.id, ...query });
  return Response.json({ items: page.items.map(mapJson), nextCursor: page.nextCursor });
});
