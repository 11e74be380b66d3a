import { authorize, resolveActor } from "@/app/api/_lib/actor";
import { parseBody, parseParams, route } from "@/app/api/_lib/handler";
import { changeRole, removeFromWorkspace } from "@/server/team/members";
import { ChangeRoleBody, MemberParams } from "../schema";

/** PATCH /api/members/{userId} `{ "role": "curator" }`. */
export const PATCH = route<{ userId: string }>(async (request, { params }) => {
  const { userId } = await parseParams(params, MemberParams);
  const { role } = await parseBody(request, ChangeRoleBody);
  const actor = await resolveActor(request);
  authorize(actor, "member:change-role");
  return Response.json(await changeRole({ workspaceId: actor.workspace.id, userId, role, actorId: actor.user.id }));
});

/** DELETE /api/members/{userId}. */
export const DELETE = route<{ userId: string }>(async (request, { params }) => {
  const { userId } = await parseParams(params, MemberParams);
  const actor = await resolveActor(request);
  authorize(actor, "member:remove");
  await removeFromWorkspace({ workspaceId: actor.workspace.id, userId, actorId: actor.user.id });
  return Response.json({ removed: true, userId });
});
