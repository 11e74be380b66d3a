import { authorize, resolveActor } from "@/app/api/_lib/actor";
import { parseBody, parseQuery, route } from "@/app/api/_lib/handler";
import { getJobQueue } from "@/server/jobs";
import { CreateJobBody, ListJobsQuery } from "./schema";

/** POST /api/jobs: queue a job of a kind with its parameters. */
export const POST = route(async (request) => {
  const body = await parseBody(request, CreateJobBody);
  const actor = await resolveActor(request);
  authorize(actor, "job:create");
  const job = await getJobQueue().enqueue({ workspaceId: actor.workspace.id, ownerId: actor.user.id, kind: body.kind, params: body.params });
  return Response.json(job, { status: 201, headers: { location: `/api/jobs/${job.id}` } });
});

/** GET /api/jobs: the workspace's jobs, newest first; `mine=1` for one's own. */
export const GET = route(async (request) => {
  const query = parseQuery(request, ListJobsQuery);
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  const page = await getJobQueue().list({
    workspaceId: actor.workspace.id,
    ownerId: query.mine ? actor.user.id : undefined,
    status: query.status,
    cursor: query.cursor,
    limit: query.limit,
  });
  return Response.json(page);
});
