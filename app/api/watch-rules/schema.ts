import { z } from "zod";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "@/app/api/_lib/doc";
import { MODEL_KINDS, WATCH_SCOPES } from "@/db/schema";

export const WatchRuleBody = z
  .discriminatedUnion("scope", [
    z.object({ scope: z.literal("class"), modelKind: z.enum(MODEL_KINDS, { message: `Choose one of ${MODEL_KINDS.join(", ")}.` }) }),
    z.object({ scope: z.literal("onto"), modelId: z.string().min(1).max(200) }),
    z.object({ scope: z.literal("lumping-of"), modelId: z.string().min(1).max(200) }),
  ])
  .meta({
    id: "WatchRule",
    description: "`class`: every model of a kind (every ECA). `onto`: anything that coarse-grains onto the model. `lumping-of`: any lumping of the chain.",
  });
export const WatchRuleParams = z.object({ id: z.string().min(1).max(200) });

export const WatchRuleOut = z
  .object({
    id: z.string(),
    scope: z.enum(["model", ...WATCH_SCOPES]),
    modelKind: z.string().nullable(),
    modelId: z.string().nullable(),
    description: z.string().meta({ description: "In words: “every ECA”, “anything that coarse-grains onto ECA 128”." }),
  })
  .meta({ id: "Watch" });

export const watchRuleRoutes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/watch-rules",
    summary: "Everything you watch in this workspace: models, classes and saved searches",
    tags: ["watches"],
    security: SECURITY,
    responses: { 200: jsonBody(z.object({ items: z.array(WatchRuleOut) }), "Your watches"), ...errorResponses("unauthenticated", "forbidden") },
  },
  {
    method: "post",
    path: "/api/watch-rules",
    summary: "Watch a class of models or a saved search",
    tags: ["watches"],
    security: SECURITY,
    request: { body: jsonBody(WatchRuleBody, "What to watch") },
    responses: { 201: jsonBody(WatchRuleOut, "Watching"), ...errorResponses("bad_input", "unauthenticated", "forbidden", "not_found") },
  },
  {
    method: "delete",
    path: "/api/watch-rules/{id}",
    summary: "Stop a class or saved-search watch",
    tags: ["watches"],
    security: SECURITY,
    request: { params: WatchRuleParams },
    responses: { 200: jsonBody(z.object({ removed: z.literal(true), id: z.string() }), "Stopped"), ...errorResponses("unauthenticated", "forbidden", "not_found") },
  },
];
