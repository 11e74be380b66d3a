import { authorize, resolveActor } from "@/app/api/_lib/actor";
import { parseBody, route } from "@/app/api/_lib/handler";
import { addWatchRule, describeWatch, listWorkspaceWatches } from "@/db/queries/watches";
import { AppError } from "@/server/errors";
import { WatchRuleBody } from "./schema";

/** GET /api/watch-rules: what I watch. */
export const GET = route(async (request) => {
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  const items = await listWorkspaceWatches({ workspaceId: actor.workspace.id, userId: actor.user.id });
  return Response.json({ items: items.map((w) => ({ id: w.id, scope: w.scope, modelKind: w.modelKind, modelId: w.modelId, description: describeWatch(w) })) });
});

/** POST /api/watch-rules `{ "scope": "onto", "modelId": "…" }`. */
export const POST = route(async (request) => {
  const body = await parseBody(request, WatchRuleBody);
  const actor = await resolveActor(request);
  authorize(actor, "watch:manage");
  const rule = await addWatchRule({
    workspaceId: actor.workspace.id,
    userId: actor.user.id,
    scope: body.scope,
    modelKind: body.scope === "class" ? body.modelKind : null,
    modelId: body.scope === "class" ? null : body.modelId,
  });
  if (!rule) throw new AppError("not_found", "No such model in this workspace.", { field: "modelId" });
  const [view] = (await listWorkspaceWatches({ workspaceId: actor.workspace.id, userId: actor.user.id })).filter((w) => w.id === rule.id);
  return Response.json({ id: rule.id, scope: rule.scope, modelKind: rule.modelKind, modelId: rule.modelId, description: describeWatch(view ?? { ...rule, modelName: null }) }, { status: 201 });
});
