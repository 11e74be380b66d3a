import { authorize, resolveActor } from "@/app/api/_lib/actor";
import { parseParams, route } from "@/app/api/_lib/handler";
import { env } from "@/env";
import { resendInvitation } from "@/server/team/invitations";
import { InvitationParams, invitationJson } from "../../schema";

/** POST /api/invitations/{id}/resend: a new link and expiry, mailed again. */
export const POST = route<{ id: string }>(async (request, { params }) => {
  const { id } = await parseParams(params, InvitationParams);
  const actor = await resolveActor(request);
  authorize(actor, "member:invite");
  const { invitation } = await resendInvitation({ workspaceId: actor.workspace.id, invitationId: id, inviter: actor.user, appUrl: env.APP_URL });
  return Response.json(invitationJson(invitation));
});
