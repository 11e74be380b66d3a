import { authorize, resolveActor } from "@/app/api/_lib/actor";
import { parseParams, route } from "@/app/api/_lib/handler";
import { revokeInvitation } from "@/db/queries/invitations";
import { AppError } from "@/server/errors";
import { InvitationParams } from "../schema";

/** DELETE /api/invitations/{id}: revoke. */
export const DELETE = route<{ id: string }>(async (request, { params }) => {
  const { id } = await parseParams(params, InvitationParams);
  const actor = await resolveActor(request);
  authorize(actor, "invitation:revoke");
  if (!(await revokeInvitation({ workspaceId: actor.workspace.id, id, actorId: actor.user.id })))
    throw new AppError("not_found", `No pending invitation ${id} in this workspace.`, { field: "id" });
  return Response.json({ revoked: true, id });
});
