import { authorize, resolveActor } from "@/app/api/_lib/actor";
import { parseParams, route } from "@/app/api/_lib/handler";
import { getJobQueue } from "@/server/jobs";
import { JobParams } from "../../schema";

/** POST /api/jobs/:id/cancel: the owner (contributor or above) or an admin. */
export const POST = route<{ id: string }>(async (request, context) => {
  const { id } = await parseParams(context.params, JobParams);
  const actor = await resolveActor(request);
  authorize(actor, "job:cancel-own");
  const job = await getJobQueue().cancel({ jobId: id, workspaceId: actor.workspace.id, actor: { userId: actor.user.id, role: actor.role } });
  return Response.json(job);
});
