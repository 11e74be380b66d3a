import { resolveActor } from "@/app/api/_lib/actor";
import { parseBody, route } from "@/app/api/_lib/handler";
import { createWorkspace, listWorkspacesForUser } from "@/db/queries/workspaces";
import { CreateWorkspaceBody } from "./schema";

/** GET /api/workspaces: mine. */
export const GET = route(async (request) => {
  const actor = await resolveActor(request);
  return Response.json({ items: await listWorkspacesForUser({ userId: actor.user.id }) });
});

/** POST /api/workspaces `{ "name": "…" }`: anyone signed in; the creator is admin. */
export const POST = route(async (request) => {
  const { name } = await parseBody(request, CreateWorkspaceBody);
  const actor = await resolveActor(request);
  const workspace = await createWorkspace({ userId: actor.user.id, name });
  return Response.json({ ...workspace, role: "admin" }, { status: 201 });
});
