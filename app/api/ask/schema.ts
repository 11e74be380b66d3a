import { z } from "zod";
import { MAX_PATH_DEPTH } from "@/db/queries/paths";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "../_lib/doc";
import { MapOut } from "../_lib/schemas";

export const Query = z.object({
  from: z.string().min(1).max(200).meta({ description: "Model A: id or `sha256:` address." }),
  to: z.string().min(1).max(200).meta({ description: "Model B: id or `sha256:` address." }),
  maxDepth: z.coerce.number().int().min(1).max(MAX_PATH_DEPTH).default(4),
});

export const AskOut = z
  .discriminatedUnion("answer", [
    z.object({
      answer: z.literal("yes"),
      reason: z.enum(["chain", "same-model"]),
      chain: z.array(MapOut).meta({ description: "The certified maps from A to B, in order (empty for A = B)." }),
      otherChains: z.number().int(),
    }),
    z.object({
      answer: z.literal("no"),
      withinBounds: z.object({ maxBlock: z.number().int().nullable(), coverage: z.record(z.string(), z.unknown()) }),
      search: z.object({ id: z.string(), kind: z.string(), algorithm: z.string(), algorithmVersion: z.string(), createdAt: z.string() }),
    }),
    z.object({
      answer: z.literal("unknown"),
      reason: z.enum(["no-search", "target-outside-search"]),
      searched: z.number().int(),
    }),
  ])
  .meta({ id: "AskAnswer" });

export const routes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/ask",
    summary: "Does A coarse-grain onto B? yes (with the chain), no within stated bounds (with the search), or unknown",
    tags: ["paths"],
    security: SECURITY,
    request: { query: Query },
    responses: {
      200: jsonBody(AskOut, "One of the three answers, saying which."),
      ...errorResponses("bad_input", "unauthenticated", "forbidden", "not_found"),
    },
  },
];
