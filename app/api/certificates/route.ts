import { submitBuild, submitCertificate } from "@/server/atlas/submit";
import type { BuildRequest } from "@/server/atlas/verify-task";
import { authorize, resolveActor } from "../_lib/actor";
import { parseBody, route } from "../_lib/handler";
import { SubmitBody } from "./schema";

export const POST = route(async (request) => {
  const body = await parseBody(request, SubmitBody);
  const actor = await resolveActor(request);
  authorize(actor, "certificate:submit");
  const who = { workspaceId: actor.workspace.id, userId: actor.user.id };
  const result =
    body.certificate !== undefined
      ? await submitCertificate({ ...who, certificate: body.certificate })
      : await submitBuild({ ...who, build: body.build as BuildRequest });
  return Response.json(result, { status: result.status === "created" ? 201 : 200 });
});
