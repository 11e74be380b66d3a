import { authorize, resolveActor } from "@/app/api/_lib/actor";
import { parseParams, route } from "@/app/api/_lib/handler";
import { removeWatchRule } from "@/db/queries/watches";
import { AppError } from "@/server/errors";
import { WatchRuleParams } from "../schema";

/** DELETE /api/watch-rules/{id}: one of my own class or saved-search watches. */
export const DELETE = route<{ id: string }>(async (request, { params }) => {
  const { id } = await parseParams(params, WatchRuleParams);
  const actor = await resolveActor(request);
  authorize(actor, "watch:manage");
  if (!(await removeWatchRule({ workspaceId: actor.workspace.id, userId: actor.user.id, id })))
    throw new AppError("not_found", `You have no watch ${id} in this workspace.`, { field: "id" });
  return Response.json({ removed: true, id });
});
