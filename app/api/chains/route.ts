import { listChains } from "@/db/queries/atlas";
import { submitChain } from "@/server/atlas/submit";
import { authorize, resolveActor } from "../_lib/actor";
import { cachedJson } from "../_lib/cached-read";
import { parseBody, parseQuery, route } from "../_lib/handler";
import { chainJson } from "./chain-json";
import { CreateBody, ListQuery } from "./schema";

export const GET = route(async (request) => {
  const query = parseQuery(request, ListQuery);
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  return cachedJson(request, actor, async () => {
    const page = await listChains({ workspaceId: actor.workspace.id, ...query });
    return { items: page.items.map(chainJson), nextCursor: page.nextCursor };
  });
});

export const POST = route(async (request) => {
  const body = await parseBody(request, CreateBody);
  const actor = await resolveActor(request);
  authorize(actor, "chain:submit");
  const result = await submitChain({ workspaceId: actor.workspace.id, userId: actor.user.id, ...body });
  return Response.json(result, { status: result.status === "created" ? 201 : 200 });
});
