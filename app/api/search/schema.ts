import { z } from "zod";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "../_lib/doc";
import { Cursor, Limit, MapKind, MapOut, ModelKind, ModelOut, SmallInt } from "../_lib/schemas";

export const Query = z.object({
  target: z.enum(["models", "maps"]).default("models").meta({ description: "List models (nodes) or maps (edges)." }),
  q: z.string().trim().max(200).optional().meta({ description: "Part of a name or summary, or a full `sha256:` address. A term of one or two letters or digits matches the beginning of a word." }),
  rule: z.coerce.number().int().min(0).max(255).optional().meta({ description: "ECA rule number (of the source, for maps)." }),
  symmetryClass: z.coerce.number().int().min(0).max(255).optional(),
  tag: z.string().trim().min(1).max(100).optional(),
  block: SmallInt.optional(),
  mapKind: MapKind.optional(),
  modelKind: ModelKind.optional(),
  includeRetracted: z.enum(["true", "false"]).default("false").transform((v) => v === "true"),
  limit: Limit,
  cursor: Cursor,
});

export const SearchOut = z
  .object({
    target: z.enum(["models", "maps"]),
    items: z.array(z.union([ModelOut, MapOut])),
    nextCursor: z.string().nullable(),
  })
  .meta({ id: "SearchResult" });

export const routes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/search",
    summary: "Search models or maps by name, rule number, symmetry class, tag, block size and kind",
    tags: ["search"],
    security: SECURITY,
    request: { query: Query },
    responses: { 200: jsonBody(SearchOut, "One page of results."), ...errorResponses("bad_input", "unauthenticated", "forbidden") },
  },
];
