import { authorize, resolveActor } from "@/app/api/_lib/actor";
import { parseParams, route } from "@/app/api/_lib/handler";
import { AppError } from "@/server/errors";
import { getJobQueue } from "@/server/jobs";
import { JobParams } from "../schema";

/** GET /api/jobs/:id: progress, status and result (the jobs page polls this). */
export const GET = route<{ id: string }>(async (request, context) => {
  const { id } = await parseParams(context.params, JobParams);
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  const job = await getJobQueue().get({ jobId: id, workspaceId: actor.workspace.id });
  if (!job) throw new AppError("not_found", `No job ${id} in this workspace.`, { field: "id" });
  return Response.json(job);
});
