import { getModel, listMapsFrom, listMapsTo } from "@/db/queries/atlas";
import { AppError } from "@/server/errors";
import { authorize, resolveActor } from "../../../_lib/actor";
import { cachedJson } from "../../../_lib/cached-read";
import { parseParams, parseQuery, route } from "../../../_lib/handler";
import { mapJson } from "../../../_lib/schemas";
import { Params, Query } from "./schema";

export const GET = route<{ id: string }>(async (request, { params }) => {
  const { id } = await parseParams(params, Params);
  const query = parseQuery(request, Query);
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  const workspaceId = actor.workspace.id;
  const list = query.direction === "from" ? listMapsFrom : listMapsTo;
  const notFound = () => new AppError("not_found", `No model ${id} in this workspace.`, { field: "id" });
  return cachedJson(request, actor, async () => {
    // By id the list is the only query on the hot path; an empty page checks that the model exists.
    const modelId = id.startsWith("sha256:") ? (await getModel({ workspaceId, idOrAddress: id }))?.id : id;
    if (!modelId) throw notFound();
    const page = await list({ workspaceId, modelId, ...query });
    if (page.items.length === 0 && !(await getModel({ workspaceId, idOrAddress: modelId }))) throw notFound();
    return { items: page.items.map(mapJson), nextCursor: page.nextCursor };
  });
});
