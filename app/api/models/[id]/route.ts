import { getModel } from "@/db/queries/atlas";
import { AppError } from "@/server/errors";
import { authorize, resolveActor } from "../../_lib/actor";
import { cachedJson } from "../../_lib/cached-read";
import { parseParams, route } from "../../_lib/handler";
import { modelJson } from "../../_lib/schemas";
import { Params } from "./schema";

export const GET = route<{ id: string }>(async (request, { params }) => {
  const { id } = await parseParams(params, Params);
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  return cachedJson(request, actor, async () => {
    const model = await getModel({ workspaceId: actor.workspace.id, idOrAddress: id });
    if (!model) throw new AppError("not_found", `No model ${id} in this workspace.`, { field: "id" });
    return modelJson(model);
  });
});
