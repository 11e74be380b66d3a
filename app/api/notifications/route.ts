import { authorize, resolveActor } from "@/app/api/_lib/actor";
import { route } from "@/app/api/_lib/handler";
import { getMailDelivery } from "@/db/queries/memberships";
import { countUnreadNotifications, listNotifications } from "@/db/queries/notifications";

/** GET /api/notifications. */
export const GET = route(async (request) => {
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  const where = { workspaceId: actor.workspace.id, userId: actor.user.id };
  const [items, unread, delivery] = await Promise.all([listNotifications(where), countUnreadNotifications(where), getMailDelivery(where)]);
  return Response.json({
    unread,
    delivery,
    items: items.map((n) => ({ id: n.id, title: n.title, body: n.body, link: n.link, read: n.readAt !== null, createdAt: n.createdAt.toISOString() })),
  });
});
