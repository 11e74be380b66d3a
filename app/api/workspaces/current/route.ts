import { authorize, resolveActor } from "@/app/api/_lib/actor";
import { parseBody, route } from "@/app/api/_lib/handler";
import { setPublicView } from "@/db/queries/workspaces";
import { env } from "@/env";
import { PublicViewBody } from "../schema";

/** PATCH /api/workspaces/current `{ "publicView": true }` (admins). */
export const PATCH = route(async (request) => {
  const { publicView } = await parseBody(request, PublicViewBody);
  const actor = await resolveActor(request);
  authorize(actor, "workspace:publish");
  await setPublicView({ workspaceId: actor.workspace.id, on: publicView, actorId: actor.user.id });
  const publicUrl = publicView ? new URL(`/public/${actor.workspace.slug}`, env.APP_URL).toString() : null;
  return Response.json({ id: actor.workspace.id, slug: actor.workspace.slug, publicView, publicUrl });
});
