import { authorize, resolveActor } from "@/app/api/_lib/actor";
import { parseQuery, route } from "@/app/api/_lib/handler";
import { getMailDelivery } from "@/db/queries/memberships";
import { countUnreadNotifications, listNotifications } from "@/db/queries/notifications";
import { ListQuery } from "./schema";

/** GET /api/notifications: one page, newest first, with the cursor of the next. */
export const GET = route(async (request) => {
  const query = parseQuery(request, ListQuery);
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  const where = { workspaceId: actor.workspace.id, userId: actor.user.id };
  const [page, unread, delivery] = await Promise.all([listNotifications({ ...where, ...query }), countUnreadNotifications(where), getMailDelivery(where)]);
  return Response.json({
    unread,
    delivery,
    nextCursor: page.nextCursor,
    items: page.items.map((n) => ({ id: n.id, title: n.title, body: n.body, link: n.link, read: n.readAt !== null, createdAt: n.createdAt.toISOString() })),
  });
});
