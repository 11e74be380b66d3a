import { z } from "zod";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "../../../_lib/doc";
import { IdParams, MapOut } from "../../../_lib/schemas";

export const Params = IdParams;
export const Body = z
  .object({
    reason: z.string().trim().min(3, "Give a reason of at least 3 characters.").max(2000),
  })
  .meta({ id: "RetractRequest" });

export const routes: RouteConfig[] = [
  {
    method: "post",
    path: "/api/maps/{id}/retract",
    summary: "Retract a map (curators): it stays in the atlas, marked with the reason",
    tags: ["maps"],
    security: SECURITY,
    request: { params: Params, body: jsonBody(Body, "Why the map is withdrawn.") },
    responses: {
      200: jsonBody(MapOut, "The retracted map."),
      ...errorResponses("bad_input", "unauthenticated", "forbidden", "not_found", "conflict"),
    },
  },
];
