import { getCertificate } from "@/db/queries/atlas";
import { AppError } from "@/server/errors";
import { authorize, resolveActor } from "../../_lib/actor";
import { parseParams, route } from "../../_lib/handler";
import { Params } from "./schema";

export const GET = route<{ address: string }>(async (request, { params }) => {
  const { address } = await parseParams(params, Params);
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  const row = await getCertificate({ address });
  if (!row) throw new AppError("not_found", `No certificate ${address}.`, { field: "address" });
  return Response.json({
    address: row.address,
    kind: row.kind,
    formatVersion: row.formatVersion,
    checkerVersion: row.checkerVersion,
    verifiedAt: row.verifiedAt.toISOString(),
    certificate: JSON.parse(row.body) as unknown,
  });
});
