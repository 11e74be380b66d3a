import { z } from "zod";
import { errorResponses, jsonBody, type RouteConfig } from "@/app/api/_lib/doc";

const SECURITY: RouteConfig["security"] = [{ bearer: [] }, { session: [] }];

export const WatchBody = z.object({ modelId: z.string().min(1).max(200) }).meta({ id: "WatchModel" });
export const WatchQuery = z.object({ modelId: z.string().min(1).max(200) });

export const WatchStateOut = z
  .object({
    modelId: z.string(),
    watching: z.boolean().meta({ description: "Whether you get mail when a certified map touches this model." }),
    watchers: z.number().int().min(0),
  })
  .meta({ id: "WatchState" });

export const watchRoutes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/watches",
    summary: "Whether you watch a model",
    tags: ["watches"],
    security: SECURITY,
    request: { query: WatchQuery },
    responses: { 200: jsonBody(WatchStateOut, "The watch state"), ...errorResponses("bad_input", "unauthenticated", "forbidden", "not_found") },
  },
  {
    method: "post",
    path: "/api/watches",
    summary: "Watch a model: mail when a new certified map starts or ends at it",
    tags: ["watches"],
    security: SECURITY,
    request: { body: jsonBody(WatchBody, "The model") },
    responses: { 200: jsonBody(WatchStateOut, "The watch state"), ...errorResponses("bad_input", "unauthenticated", "forbidden", "not_found") },
  },
  {
    method: "delete",
    path: "/api/watches",
    summary: "Stop watching a model",
    tags: ["watches"],
    security: SECURITY,
    request: { query: WatchQuery },
    responses: { 200: jsonBody(WatchStateOut, "The watch state"), ...errorResponses("bad_input", "unauthenticated", "forbidden", "not_found") },
  },
];
