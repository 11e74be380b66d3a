import { extendZodWithOpenApi, OpenAPIRegistry, OpenApiGeneratorV31 } from "@asteasolutions/zod-to-openapi";
import { z } from "zod";
import type { RouteConfig } from "./doc";
import { routes as ask } from "../ask/schema";
import { routes as certificateByAddress } from "../certificates/[address]/schema";
import { routes as certificates } from "../certificates/schema";
import { routes as certificateSchema } from "../certificates/schema/schema";
import { routes as chains } from "../chains/schema";
import { routes as certifyWorkbench } from "../chains/workbench/schema";
import { routes as drafts } from "../drafts/schema";
import { jobRoutes } from "../jobs/schema";
import { routes as retract } from "../maps/[id]/retract/schema";
import { routes as mapById } from "../maps/[id]/schema";
import { routes as symmetry } from "../maps/[id]/symmetry/schema";
import { routes as modelMaps } from "../models/[id]/maps/schema";
import { routes as modelById } from "../models/[id]/schema";
import { routes as notes } from "../notes/schema";
import { routes as models } from "../models/schema";
import { routes as paths } from "../paths/schema";
import { routes as search } from "../search/schema";
import { routes as tokens } from "../tokens/schema";
import { watchRoutes } from "../watches/schema";
import { routes as workspaceExport } from "../workspace/export/schema";
import { routes as workspaceImport } from "../workspace/import/schema";
import { memberRoutes } from "../members/schema";
import { invitationRoutes } from "../invitations/schema";
import { workspaceRoutes } from "../workspaces/schema";
import { watchRuleRoutes } from "../watch-rules/schema";
import { notificationRoutes } from "../notifications/schema";
import { outboxRoutes } from "../outbox/schema";
import { auditRoutes } from "../audit/schema";
import { annotationRoutes } from "../annotations/schema";

const ALL_ROUTES: RouteConfig[] = [
  ...models,
  ...modelById,
  ...modelMaps,
  ...certificates,
  ...certificateSchema,
  ...certificateByAddress,
  ...mapById,
  ...retract,
  ...symmetry,
  ...chains,
  ...certifyWorkbench,
  ...paths,
  ...ask,
  ...search,
  ...jobRoutes,
  ...watchRoutes,
  ...tokens,
  ...notes,
  ...workspaceExport,
  ...workspaceImport,
  ...memberRoutes,
  ...invitationRoutes,
  ...workspaceRoutes,
  ...watchRuleRoutes,
  ...notificationRoutes,
  ...outboxRoutes,
  ...auditRoutes,
  ...annotationRoutes,
  ...drafts,
];

// The generator describes each query and path parameter through `.openapi()`, which this adds to
// zod's types; zod 4 gives it only to schemas made afterwards, so parameters are rebuilt below.
extendZodWithOpenApi(z);

function rebuilt(schema: z.ZodType): z.ZodType {
  const copy = schema.clone();
  const meta = z.globalRegistry.get(schema);
  return meta ? copy.meta(meta) : copy;
}

function parameterObject(schema: unknown): z.ZodObject | undefined {
  if (!schema) return undefined;
  const s = schema as z.ZodType;
  const object = s instanceof z.ZodPipe ? (s.in as z.ZodType) : s;
  if (!(object instanceof z.ZodObject)) return undefined;
  return z.object(Object.fromEntries(Object.entries(object.shape).map(([k, v]) => [k, rebuilt(v as z.ZodType)])));
}

function withParameters(r: RouteConfig): RouteConfig {
  if (!r.request) return r;
  const request = { ...r.request };
  if (request.query) request.query = parameterObject(request.query) as typeof request.query;
  if (request.params) request.params = parameterObject(request.params) as typeof request.params;
  return { ...r, request };
}

let cached: ReturnType<OpenApiGeneratorV31["generateDocument"]> | null = null;

/** The OpenAPI 3.1 document, generated from the same zod schemas the handlers parse with. */
export function openApiDocument() {
  if (cached) return cached;
  const registry = new OpenAPIRegistry();
  registry.registerComponent("securitySchemes", "bearer", {
    type: "http",
    scheme: "bearer",
    description: "A personal API token from the API tokens page, /settings/tokens (`Authorization: Bearer sqt_…`).",
  });
  registry.registerComponent("securitySchemes", "session", {
    type: "apiKey",
    in: "cookie",
    name: "authjs.session-token",
    description: "The browser session after signing in.",
  });
  for (const r of ALL_ROUTES) registry.registerPath(withParameters(r));
  cached = new OpenApiGeneratorV31(registry.definitions).generateDocument({
    openapi: "3.1.0",
    info: {
      title: "Squarely atlas API",
      version: "1.0.0",
      description:
        "Models are nodes, certified maps are edges, chains are proofs. Every write is re-verified on the server before it is stored. Errors share one shape: `{ error: { code, message, field?, details? } }`.",
    },
    servers: [{ url: "/" }],
  });
  return cached;
}
