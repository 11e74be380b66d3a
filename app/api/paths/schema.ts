import { z } from "zod";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "../_lib/doc";
import { MapOut } from "../_lib/schemas";
import { MAX_PATH_DEPTH } from "@/db/queries/paths";

export const Query = z.object({
  from: z.string().min(1).max(200).meta({ description: "Model id or `sha256:` address." }),
  to: z.string().min(1).max(200).meta({ description: "Model id or `sha256:` address." }),
  maxDepth: z.coerce.number().int().min(1).max(MAX_PATH_DEPTH).default(4),
  limit: z.coerce.number().int().min(1).max(500).default(50),
});

export const PathsOut = z
  .object({
    paths: z.array(z.object({ maps: z.array(MapOut), depth: z.number().int() })),
    maxDepth: z.number().int(),
  })
  .meta({ id: "Paths" });

export const routes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/paths",
    summary: "All simple paths of certified maps between two models, shortest first, up to a depth bound",
    description: "Each path is a chain that could be composed and certified as one (POST /api/chains).",
    tags: ["paths"],
    security: SECURITY,
    request: { query: Query },
    responses: {
      200: jsonBody(PathsOut, "Paths as ordered maps."),
      ...errorResponses("bad_input", "unauthenticated", "forbidden", "not_found"),
    },
  },
];
