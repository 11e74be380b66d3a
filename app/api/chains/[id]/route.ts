import { getChain } from "@/db/queries/atlas";
import { AppError } from "@/server/errors";
import { authorize, resolveActor } from "../../_lib/actor";
import { parseParams, route } from "../../_lib/handler";
import { chainJson } from "../chain-json";
import { Params } from "../schema";

export const GET = route<{ id: string }>(async (request, { params }) => {
  const { id } = await parseParams(params, Params);
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  const chain = await getChain({ workspaceId: actor.workspace.id, chainId: id });
  if (!chain) throw new AppError("not_found", `No chain ${id} in this workspace.`, { field: "id" });
  return Response.json(chainJson(chain));
});
