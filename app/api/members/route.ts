import { authorize, resolveActor } from "@/app/api/_lib/actor";
import { route } from "@/app/api/_lib/handler";
import { listMembers } from "@/db/queries/memberships";

/** GET /api/members: everyone in the workspace with their role. */
export const GET = route(async (request) => {
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  return Response.json({ items: await listMembers({ workspaceId: actor.workspace.id }) });
});
