import type { z } from "zod";
import { findPaths, getMap, getModel, type MapView } from "@/db/queries/atlas";
import { AppError } from "@/server/errors";
import { authorize, resolveActor } from "../_lib/actor";
import { cachedJson } from "../_lib/cached-read";
import { parseQuery, route } from "../_lib/handler";
import { mapJson } from "../_lib/schemas";
import { Query } from "./schema";

export const GET = route(async (request) => {
  const query = parseQuery(request, Query);
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  const workspaceId = actor.workspace.id;
  return cachedJson(request, actor, () => readPaths(workspaceId, query));
});

async function readPaths(workspaceId: string, query: z.output<typeof Query>) {
  const [from, to] = await Promise.all([
    getModel({ workspaceId, idOrAddress: query.from }),
    getModel({ workspaceId, idOrAddress: query.to }),
  ]);
  if (!from) throw new AppError("not_found", `No model ${query.from} in this workspace.`, { field: "from" });
  if (!to) throw new AppError("not_found", `No model ${query.to} in this workspace.`, { field: "to" });
  const paths = await findPaths({ workspaceId, from: from.id, to: to.id, maxDepth: query.maxDepth, limit: query.limit });
  const ids = [...new Set(paths.flatMap((p) => p.mapIds))];
  const views = new Map<string, MapView>();
  for (const v of await Promise.all(ids.map((mapId) => getMap({ workspaceId, mapId })))) if (v) views.set(v.id, v);
  return {
    paths: paths.map((p) => ({ depth: p.mapIds.length, maps: p.mapIds.map((id) => mapJson(views.get(id)!)) })),
    maxDepth: query.maxDepth,
  };
}
