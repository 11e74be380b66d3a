import { authorize, resolveActor, type Actor } from "@/app/api/_lib/actor";
import { parseBody, parseQuery, route } from "@/app/api/_lib/handler";
import { getWatchState, unwatchModel, watchModel } from "@/db/queries/watches";
import { AppError } from "@/server/errors";
import { WatchBody, WatchQuery } from "./schema";

async function state(actor: Actor, modelId: string) {
  return { modelId, ...(await getWatchState({ workspaceId: actor.workspace.id, userId: actor.user.id, modelId })) };
}

/** GET /api/watches?modelId=…: whether I watch the model. */
export const GET = route(async (request) => {
  const { modelId } = parseQuery(request, WatchQuery);
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  return Response.json(await state(actor, modelId));
});

/** POST /api/watches `{ "modelId": "…" }`: watch it (idempotent). */
export const POST = route(async (request) => {
  const { modelId } = await parseBody(request, WatchBody);
  const actor = await resolveActor(request);
  authorize(actor, "watch:manage");
  const watch = await watchModel({ workspaceId: actor.workspace.id, userId: actor.user.id, modelId });
  if (!watch) throw new AppError("not_found", `No model ${modelId} in this workspace.`, { field: "modelId" });
  return Response.json(await state(actor, modelId));
});

/** DELETE /api/watches?modelId=…: stop watching (idempotent). */
export const DELETE = route(async (request) => {
  const { modelId } = parseQuery(request, WatchQuery);
  const actor = await resolveActor(request);
  authorize(actor, "watch:manage");
  await unwatchModel({ workspaceId: actor.workspace.id, userId: actor.user.id, modelId });
  return Response.json(await state(actor, modelId));
});
