import { z } from "zod";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "../_lib/doc";
import { IdParams } from "../_lib/schemas";

const Id = z.string().min(1).max(100);
const Text = (max: number) => z.string().max(max);

/** A canvas as the workbench saves it (components/workbench/workbenchState Workbench). */
export const DraftCanvas = z
  .object({
    nodes: z
      .array(
        z.object({
          id: Id,
          name: Text(200),
          description: Text(2000),
          model: z.looseObject({ kind: z.string().max(20) }).nullable(),
          modelId: Id.nullable(),
          note: Text(500),
          x: z.number().finite(),
          y: z.number().finite(),
        }),
      )
      .max(500, "A draft holds at most 500 nodes."),
    edges: z
      .array(
        z.object({
          id: Id,
          source: Id,
          target: Id,
          spec: z.looseObject({ kind: z.enum(["projection", "lumping", "decimation", "iterate", "blocking"]) }).nullable(),
          state: z.enum(["proposed", "checking", "certified", "refused"]),
          mapId: Id.nullable(),
          certificateAddress: Text(100).nullable(),
          problem: z.object({ message: Text(2000), counterexample: z.unknown().optional() }).nullable(),
          atlasText: Text(200).optional(),
        }),
      )
      .max(1000, "A draft holds at most 1000 maps."),
    chain: z.object({ name: Text(200), id: Id.nullable(), address: Text(100).nullable() }),
  })
  .meta({ id: "DraftCanvas" });

const Name = z.string().trim().min(1, "Give the draft a name.").max(200, "Keep the name under 200 characters.");

export const CreateDraftBody = z.object({ name: Name, canvas: DraftCanvas.optional() }).meta({ id: "CreateDraftRequest" });
export const UpdateDraftBody = z
  .object({ name: Name.optional(), canvas: DraftCanvas.optional(), shared: z.boolean().optional() })
  .refine((b) => b.name !== undefined || b.canvas !== undefined || b.shared !== undefined, { message: "Send name, canvas or shared.", path: ["name"] })
  .meta({ id: "UpdateDraftRequest" });

export const DraftOut = z
  .object({
    id: z.string(),
    name: z.string(),
    ownerId: z.string(),
    ownerName: z.string(),
    shared: z.boolean(),
    mine: z.boolean(),
    canvas: DraftCanvas.optional(),
    createdAt: z.string(),
    updatedAt: z.string(),
  })
  .meta({ id: "Draft" });

export const Params = IdParams;

export const routes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/drafts",
    summary: "My workbench drafts and those shared with the workspace, most recent first",
    tags: ["drafts"],
    security: SECURITY,
    responses: { 200: jsonBody(z.object({ items: z.array(DraftOut) }), "The drafts, without their canvases."), ...errorResponses("unauthenticated", "forbidden") },
  },
  {
    method: "post",
    path: "/api/drafts",
    summary: "Save a new draft (contributor or above)",
    tags: ["drafts"],
    security: SECURITY,
    request: { body: jsonBody(CreateDraftBody, "Its name and canvas.") },
    responses: { 201: jsonBody(DraftOut, "The draft."), ...errorResponses("bad_input", "unauthenticated", "forbidden", "too_large") },
  },
  {
    method: "get",
    path: "/api/drafts/{id}",
    summary: "One draft with its canvas: mine, or shared with the workspace (read-only)",
    tags: ["drafts"],
    security: SECURITY,
    request: { params: Params },
    responses: { 200: jsonBody(DraftOut, "The draft."), ...errorResponses("unauthenticated", "forbidden", "not_found") },
  },
  {
    method: "patch",
    path: "/api/drafts/{id}",
    summary: "Rename, save or share my draft; a shared draft of someone else answers 403 and is not changed",
    tags: ["drafts"],
    security: SECURITY,
    request: { params: Params, body: jsonBody(UpdateDraftBody, "What changes.") },
    responses: { 200: jsonBody(DraftOut, "The draft."), ...errorResponses("bad_input", "unauthenticated", "forbidden", "not_found", "too_large") },
  },
  {
    method: "delete",
    path: "/api/drafts/{id}",
    summary: "Delete my draft",
    tags: ["drafts"],
    security: SECURITY,
    request: { params: Params },
    responses: { 200: jsonBody(z.object({ deleted: z.literal(true) }), "Deleted."), ...errorResponses("unauthenticated", "forbidden", "not_found") },
  },
  {
    method: "post",
    path: "/api/drafts/{id}/duplicate",
    summary: "Copy a draft I can see into a new draft of mine",
    tags: ["drafts"],
    security: SECURITY,
    request: { params: Params },
    responses: { 201: jsonBody(DraftOut, "The copy."), ...errorResponses("unauthenticated", "forbidden", "not_found") },
  },
];
