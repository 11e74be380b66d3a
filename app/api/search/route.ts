import { searchAtlas } from "@/db/queries/atlas";
import type { Model } from "@/db/schema";
import type { MapView } from "@/db/queries/atlas";
import { authorize, resolveActor } from "../_lib/actor";
import { cachedJson } from "../_lib/cached-read";
import { parseQuery, route } from "../_lib/handler";
import { mapJson, modelJson } from "../_lib/schemas";
import { Query } from "./schema";

export const GET = route(async (request) => {
  const query = parseQuery(request, Query);
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  return cachedJson(request, actor, async () => {
    const result = await searchAtlas({ workspaceId: actor.workspace.id, ...query });
    const items =
      result.target === "models" ? (result.items as Model[]).map(modelJson) : (result.items as MapView[]).map(mapJson);
    return { target: result.target, items, nextCursor: result.nextCursor };
  });
});
