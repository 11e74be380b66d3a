import { authorize, resolveActor } from "@/app/api/_lib/actor";
import { parseBody, route } from "@/app/api/_lib/handler";
import { listPendingInvitations } from "@/db/queries/invitations";
import { env } from "@/env";
import { inviteMember } from "@/server/team/invitations";
import { InviteBody, invitationJson } from "./schema";

/** GET /api/invitations: pending invitations (admins). */
export const GET = route(async (request) => {
  const actor = await resolveActor(request);
  authorize(actor, "member:invite");
  const rows = await listPendingInvitations({ workspaceId: actor.workspace.id });
  return Response.json({ items: rows.map(invitationJson) });
});

/** POST /api/invitations `{ "email": "…", "role": "contributor" }`. */
export const POST = route(async (request) => {
  const body = await parseBody(request, InviteBody);
  const actor = await resolveActor(request);
  authorize(actor, "member:invite");
  const { invitation } = await inviteMember({ workspaceId: actor.workspace.id, inviter: actor.user, email: body.email, role: body.role, days: body.days, appUrl: env.APP_URL });
  return Response.json(invitationJson(invitation), { status: 201 });
});
