import { z } from "zod";
import { ROLES } from "@/lib/policy";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "../_lib/doc";
import { IdParams } from "../_lib/schemas";

export const CreateBody = z
  .object({
    name: z.string().trim().min(1, "Name the token (e.g. the notebook that uses it).").max(100),
    role: z.enum(ROLES).default("viewer").meta({ description: "At most your own role in the workspace." }),
  })
  .meta({ id: "CreateTokenRequest" });

export const TokenOut = z
  .object({
    id: z.string(),
    name: z.string(),
    prefix: z.string(),
    role: z.enum(ROLES),
    workspaceId: z.string(),
    lastUsedAt: z.string().nullable(),
    revokedAt: z.string().nullable(),
    createdAt: z.string(),
  })
  .meta({ id: "ApiToken" });

export const CreatedOut = z
  .object({ token: TokenOut, secret: z.string().meta({ description: "Shown this once; only its SHA-256 is kept." }) })
  .meta({ id: "CreatedToken" });

export const Params = IdParams;

export const routes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/tokens",
    summary: "Your personal API tokens in the current workspace",
    tags: ["tokens"],
    security: SECURITY,
    responses: {
      200: jsonBody(z.object({ items: z.array(TokenOut) }), "Tokens, revoked ones included."),
      ...errorResponses("unauthenticated", "forbidden"),
    },
  },
  {
    method: "post",
    path: "/api/tokens",
    summary: "Create a personal API token (the secret is returned once)",
    tags: ["tokens"],
    security: SECURITY,
    request: { body: jsonBody(CreateBody, "Name and role of the token.") },
    responses: {
      201: jsonBody(CreatedOut, "The token and its secret."),
      ...errorResponses("bad_input", "unauthenticated", "forbidden"),
    },
  },
  {
    method: "delete",
    path: "/api/tokens/{id}",
    summary: "Revoke one of your tokens",
    tags: ["tokens"],
    security: SECURITY,
    request: { params: Params },
    responses: { 200: jsonBody(TokenOut, "The revoked token."), ...errorResponses("unauthenticated", "forbidden", "not_found") },
  },
];
