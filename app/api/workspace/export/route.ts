import { exportWorkspaceBundle, exportWorkspaceGraphml } from "@/server/bundle/workspace-bundle";
import { authorize, resolveActor } from "../../_lib/actor";
import { parseQuery, route } from "../../_lib/handler";
import { ExportQuery } from "./schema";

/** The whole workspace as one JSON bundle (importable elsewhere) or as GraphML for graph tools. */
export const GET = route(async (request) => {
  const query = parseQuery(request, ExportQuery);
  const actor = await resolveActor(request);
  authorize(actor, "atlas:read");
  const stem = `${actor.workspace.slug}-${new Date().toISOString().slice(0, 10)}`;
  if (query.format === "graphml") {
    const text = await exportWorkspaceGraphml({ workspaceId: actor.workspace.id, workspaceName: actor.workspace.name });
    return new Response(text, {
      headers: { "content-type": "application/graphml+xml; charset=utf-8", "content-disposition": `attachment; filename="${stem}.graphml"` },
    });
  }
  const bundle = await exportWorkspaceBundle({ workspaceId: actor.workspace.id, workspaceName: actor.workspace.name });
  return new Response(JSON.stringify(bundle), {
    headers: { "content-type": "application/json; charset=utf-8", "content-disposition": `attachment; filename="${stem}.squarely.json"` },
  });
});
