import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "../../_lib/doc";
import { IdParams, MapOut } from "../../_lib/schemas";

export const Params = IdParams;

export const routes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/maps/{id}",
    summary: "One map (edge) with its status and certificate address",
    tags: ["maps"],
    security: SECURITY,
    request: { params: Params },
    responses: { 200: jsonBody(MapOut, "The map."), ...errorResponses("unauthenticated", "forbidden", "not_found") },
  },
];
