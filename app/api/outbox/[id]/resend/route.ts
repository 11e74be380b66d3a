import { authorize, resolveActor } from "@/app/api/_lib/actor";
import { parseParams, route } from "@/app/api/_lib/handler";
import { resendOutboxMessage } from "@/db/queries/outbox";
import { AppError } from "@/server/errors";
import { OutboxParams } from "../../schema";

/** POST /api/outbox/{id}/resend (admins): only a failed message of this workspace. */
export const POST = route<{ id: string }>(async (request, { params }) => {
  const { id } = await parseParams(params, OutboxParams);
  const actor = await resolveActor(request);
  authorize(actor, "outbox:manage");
  if (!(await resendOutboxMessage({ workspaceId: actor.workspace.id, id })))
    throw new AppError("conflict", "Only a failed message of this workspace can be sent again.", { field: "id" });
  return Response.json({ id, status: "pending" });
});
