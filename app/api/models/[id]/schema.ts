import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "../../_lib/doc";
import { IdParams, ModelOut } from "../../_lib/schemas";

export const Params = IdParams;

export const routes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/models/{id}",
    summary: "One model by id or by `sha256:` address",
    tags: ["models"],
    security: SECURITY,
    request: { params: Params },
    responses: { 200: jsonBody(ModelOut, "The model."), ...errorResponses("unauthenticated", "forbidden", "not_found") },
  },
];
