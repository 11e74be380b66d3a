import { authorize, resolveActor } from "@/app/api/_lib/actor";
import { parseBody, route } from "@/app/api/_lib/handler";
import { countUnreadNotifications, markNotificationsRead } from "@/db/queries/notifications";
import { ReadBody } from "../schema";

/** POST /api/notifications/read `{ "ids": [...] }` or `{}` for all. */
export const POST = route(async (request) => {
  const { ids } = await parseBody(request, ReadBody);
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  const where = { workspaceId: actor.workspace.id, userId: actor.user.id };
  const marked = await markNotificationsRead({ ...where, ids });
  return Response.json({ marked, unread: await countUnreadNotifications(where) });
});
