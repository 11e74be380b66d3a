import { authorize, resolveActor } from "@/app/api/_lib/actor";
import { parseBody, route } from "@/app/api/_lib/handler";
import { setMailDelivery } from "@/db/queries/memberships";
import { DeliveryBody } from "../schema";

/** PUT /api/notifications/delivery `{ "delivery": "digest" }`. */
export const PUT = route(async (request) => {
  const { delivery } = await parseBody(request, DeliveryBody);
  const actor = await resolveActor(request);
  authorize(actor, "watch:manage");
  await setMailDelivery({ workspaceId: actor.workspace.id, userId: actor.user.id, delivery });
  return Response.json({ delivery });
});
