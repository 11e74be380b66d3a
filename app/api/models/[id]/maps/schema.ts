import { z } from "zod";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "../../../_lib/doc";
import { Cursor, IdParams, Limit, MapKind, MapOut, pageOf, SmallInt } from "../../../_lib/schemas";

export const Params = IdParams;
export const Query = z.object({
  direction: z.enum(["from", "to"]).default("from").meta({
    description: "`from`: what this model coarse-grains to; `to`: what coarse-grains onto it.",
  }),
  kind: MapKind.optional(),
  block: SmallInt.optional(),
  includeRetracted: z.enum(["true", "false"]).default("false").transform((v) => v === "true"),
  limit: Limit,
  cursor: Cursor,
});

export const routes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/models/{id}/maps",
    summary: "What a model coarse-grains to (direction=from) or from (direction=to)",
    tags: ["maps"],
    security: SECURITY,
    request: { params: Params, query: Query },
    responses: {
      200: jsonBody(pageOf(MapOut), "Certified maps with block size, kind and the model at the other end."),
      ...errorResponses("bad_input", "unauthenticated", "forbidden", "not_found"),
    },
  },
];
