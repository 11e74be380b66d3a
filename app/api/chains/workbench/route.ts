import { submitWorkbench } from "@/server/atlas/submit-workbench";
import { authorize, resolveActor } from "../../_lib/actor";
import { parseBody, route } from "../../_lib/handler";
import { WorkbenchBody } from "./schema";

export const POST = route(async (request) => {
  const body = await parseBody(request, WorkbenchBody);
  const actor = await resolveActor(request);
  if (body.models.some((m) => m.model !== undefined)) authorize(actor, "model:create");
  authorize(actor, "certificate:submit");
  if (body.chain) authorize(actor, "chain:submit");
  const timing: Record<string, number> = {};
  const result = await submitWorkbench({ workspaceId: actor.workspace.id, userId: actor.user.id, request: body, timing });
  // Where the time went (W3C Server Timing): the benchmark prints it.
  const serverTiming = Object.entries(timing).map(([phase, ms]) => `${phase};dur=${ms.toFixed(1)}`).join(", ");
  return Response.json(result, { headers: { "server-timing": serverTiming } });
});
