import { searchAtlas } from "@/db/queries/atlas";
import { nameModelIfGeneric } from "@/db/queries/model-names";
import { describeModel, type Model as CanonicalModel } from "@/lib/models";
import type { Model } from "@/db/schema";
import { ensureModel } from "@/server/atlas/submit";
import { authorize, resolveActor } from "../_lib/actor";
import { cachedJson } from "../_lib/cached-read";
import { parseBody, parseQuery, route } from "../_lib/handler";
import { modelJson } from "../_lib/schemas";
import { CreateBody, ListQuery } from "./schema";

export const GET = route(async (request) => {
  const { kind, ...query } = parseQuery(request, ListQuery);
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  return cachedJson(request, actor, async () => {
    const page = await searchAtlas({ workspaceId: actor.workspace.id, target: "models", modelKind: kind, ...query });
    return { items: (page.items as Model[]).map(modelJson), nextCursor: page.nextCursor };
  });
});

export const POST = route(async (request) => {
  const body = await parseBody(request, CreateBody);
  const actor = await resolveActor(request);
  authorize(actor, "model:create");
  const stored = await ensureModel({ workspaceId: actor.workspace.id, userId: actor.user.id, model: body.model, naming: { name: body.name, description: body.description } });
  const named =
    stored.status === "existing" && body.name
      ? await nameModelIfGeneric({
          workspaceId: actor.workspace.id,
          modelId: stored.model.id,
          genericName: describeModel(JSON.parse(stored.model.canonical) as CanonicalModel),
          name: body.name,
          description: body.description,
        })
      : null;
  return Response.json(
    { status: stored.status, model: modelJson(named ?? stored.model) },
    { status: stored.status === "created" ? 201 : 200 },
  );
});
