import { z } from "zod";
import { WorkspaceBundle } from "@/server/bundle/bundle-schema";
import { errorResponses, SECURITY, type RouteConfig } from "../../_lib/doc";

export const ExportQuery = z.strictObject({
  format: z.enum(["json", "graphml"]).default("json"),
});

export const routes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/workspace/export",
    summary: "The whole workspace as one JSON bundle, or as GraphML",
    description:
      "format=json: models, certificates (each sealed by its content address), maps, chains and recorded searches, referring to each other by content address; POST /api/workspace/import reads it. format=graphml: models as nodes, maps as directed edges, for general graph tools.",
    tags: ["workspace"],
    security: SECURITY,
    request: { query: ExportQuery },
    responses: {
      200: {
        description: "The bundle (application/json) or the graph (application/graphml+xml), as a download.",
        content: { "application/json": { schema: WorkspaceBundle }, "application/graphml+xml": { schema: z.string() } },
      },
      ...errorResponses("bad_input", "unauthenticated", "forbidden"),
    },
  },
];
