import { decideAsk } from "@/components/atlas/decideAsk";
import { findPaths, getMap, getModel, listSearchRecords, type MapView } from "@/db/queries/atlas";
import { AppError } from "@/server/errors";
import { authorize, resolveActor } from "../_lib/actor";
import { parseQuery, route } from "../_lib/handler";
import { mapJson } from "../_lib/schemas";
import { Query } from "./schema";

export const GET = route(async (request) => {
  const query = parseQuery(request, Query);
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  const workspaceId = actor.workspace.id;
  const [a, b] = await Promise.all([
    getModel({ workspaceId, idOrAddress: query.from }),
    getModel({ workspaceId, idOrAddress: query.to }),
  ]);
  if (!a) throw new AppError("not_found", `No model ${query.from} in this workspace.`, { field: "from" });
  if (!b) throw new AppError("not_found", `No model ${query.to} in this workspace.`, { field: "to" });
  const same = a.id === b.id;
  const [paths, records] = await Promise.all([
    same ? [] : findPaths({ workspaceId, from: a.id, to: b.id, maxDepth: query.maxDepth, limit: 20 }),
    listSearchRecords({ workspaceId, modelId: a.id }),
  ]);
  const answer = decideAsk({
    sameModel: same,
    paths,
    records,
    targetAddress: b.address,
    // A search covers B when its coverage names B's kind among its targets (by default: A's kind).
    targetInScope: (_record, coverage) =>
      Array.isArray(coverage.targetKinds) ? coverage.targetKinds.includes(b.kind) : b.kind === a.kind,
  });
  switch (answer.answer) {
    case "yes": {
      if (answer.reason === "same-model") return Response.json({ answer: "yes", reason: "same-model", chain: [], otherChains: 0 });
      const chain = (await Promise.all(answer.mapIds.map((mapId) => getMap({ workspaceId, mapId })))).filter(
        (m): m is MapView => m !== null,
      );
      return Response.json({ answer: "yes", reason: "chain", chain: chain.map(mapJson), otherChains: answer.otherChains });
    }
    case "no":
      return Response.json({
        answer: "no",
        withinBounds: { maxBlock: answer.maxBlock, coverage: answer.coverage },
        search: {
          id: answer.record.id,
          kind: answer.record.kind,
          algorithm: answer.record.algorithm,
          algorithmVersion: answer.record.algorithmVersion,
          createdAt: answer.record.createdAt.toISOString(),
        },
      });
    case "unknown":
      return Response.json(answer);
  }
});
