import { z } from "zod";
import { jsonBody, type RouteConfig } from "../../_lib/doc";

export const routes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/certificates/schema",
    summary: "The JSON Schema of a certificate (generated from the core's zod schema)",
    tags: ["certificates"],
    responses: { 200: jsonBody(z.record(z.string(), z.unknown()), "JSON Schema (draft 2020-12).") },
  },
];
