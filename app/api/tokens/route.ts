import { createPersonalToken, listPersonalTokens } from "@/server/tokens";
import { AppError } from "@/server/errors";
import { authorize, resolveActor, type Actor } from "../_lib/actor";
import { parseBody, route } from "../_lib/handler";
import { CreateBody } from "./schema";
import { tokenJson } from "./token-json";

/** A token may not mint or list tokens: that needs the person's own session. */
function requireSession(actor: Actor): void {
  if (actor.via === "token") throw new AppError("forbidden", "Tokens are managed from a signed-in session, not with a token.");
}

export const GET = route(async (request) => {
  const actor = await resolveActor(request);
  authorize(actor, "token:manage");
  requireSession(actor);
  const items = await listPersonalTokens({ userId: actor.user.id, workspaceId: actor.workspace.id });
  return Response.json({ items: items.map(tokenJson) });
});

export const POST = route(async (request) => {
  const body = await parseBody(request, CreateBody);
  const actor = await resolveActor(request);
  authorize(actor, "token:manage");
  requireSession(actor);
  const { token, secret } = await createPersonalToken({ userId: actor.user.id, workspaceId: actor.workspace.id, ...body });
  return Response.json({ token: tokenJson(token), secret }, { status: 201 });
});
