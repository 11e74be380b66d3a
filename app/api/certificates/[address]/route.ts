import { getWorkspaceCertificate } from "@/db/queries/atlas";
import { AppError } from "@/server/errors";
import { authorize, resolveActor } from "../../_lib/actor";
import { parseParams, route } from "../../_lib/handler";
import { Params } from "./schema";

export const GET = route<{ address: string }>(async (request, { params }) => {
  const { address } = await parseParams(params, Params);
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  // Another workspace's certificate is answered exactly like one that does not exist.
  const row = await getWorkspaceCertificate({ workspaceId: actor.workspace.id, address });
  if (!row) throw new AppError("not_found", `No certificate ${address} in this workspace.`, { field: "address" });
  return Response.json({
    address: row.address,
    kind: row.kind,
    formatVersion: row.formatVersion,
    checkerVersion: row.checkerVersion,
    verifiedAt: row.verifiedAt.toISOString(),
    certificate: JSON.parse(row.body) as unknown,
  });
});
