import { z } from "zod";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "../_lib/doc";
import { Cursor, Limit, ModelKind, ModelOut, pageOf, SmallInt } from "../_lib/schemas";

export const ListQuery = z.object({
  q: z.string().trim().max(200).optional().meta({ description: "Part of a name, or a full `sha256:` address." }),
  kind: ModelKind.optional(),
  rule: z.coerce.number().int().min(0).max(255).optional(),
  symmetryClass: z.coerce.number().int().min(0).max(255).optional(),
  tag: z.string().trim().min(1).max(100).optional(),
  block: SmallInt.optional(),
  limit: Limit,
  cursor: Cursor,
});

export const CreateBody = z
  .object({
    model: z.looseObject({ kind: z.string() }).meta({
      description:
        'A model: {"kind":"markov","labels":[…],"matrix":[["1/2","1/2"],…]}, {"kind":"eca","rule":110}, {"kind":"ca","k":3,"r":1,"table":[…]}, or a derived supercell/iterate/decimated model.',
    }),
    name: z.string().trim().min(1).max(200).optional().meta({ description: "A name for a model stored now (an existing model keeps its name)." }),
    description: z.string().trim().max(2000).optional(),
  })
  .meta({ id: "CreateModelRequest" });

export const CreatedModel = z.object({ status: z.enum(["created", "existing"]), model: ModelOut }).meta({ id: "StoredModel" });

export const routes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/models",
    summary: "List and filter the models of the current workspace",
    tags: ["models"],
    security: SECURITY,
    request: { query: ListQuery },
    responses: { 200: jsonBody(pageOf(ModelOut), "One page of models."), ...errorResponses("bad_input", "unauthenticated", "forbidden") },
  },
  {
    method: "post",
    path: "/api/models",
    summary: "Store a model in canonical form (the same model twice is the same record)",
    tags: ["models"],
    security: SECURITY,
    request: { body: jsonBody(CreateBody, "The model.") },
    responses: {
      201: jsonBody(CreatedModel, "Stored now."),
      200: jsonBody(CreatedModel, "Stored before: the existing record."),
      ...errorResponses("bad_input", "unauthenticated", "forbidden", "too_large", "unsupported_media_type", "too_many_requests"),
    },
  },
];
