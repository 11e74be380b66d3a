import { revokePersonalToken } from "@/server/tokens";
import { AppError } from "@/server/errors";
import { authorize, resolveActor } from "../../_lib/actor";
import { parseParams, route } from "../../_lib/handler";
import { Params } from "../schema";
import { tokenJson } from "../token-json";

export const DELETE = route<{ id: string }>(async (request, { params }) => {
  const { id } = await parseParams(params, Params);
  const actor = await resolveActor(request);
  authorize(actor, "token:manage");
  // A token may revoke itself (a leaked token can be killed with itself), but no other token.
  if (actor.via === "token" && actor.tokenId !== id) {
    throw new AppError("forbidden", "A token can revoke only itself; manage other tokens from a signed-in session.");
  }
  const token = await revokePersonalToken({ userId: actor.user.id, tokenId: id });
  return Response.json(tokenJson(token));
});
