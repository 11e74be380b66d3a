import { z } from "zod";
import { WorkspaceBundle } from "@/server/bundle/bundle-schema";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "../../_lib/doc";

/** Bundles are larger than ordinary request bodies: a whole atlas. */
export const MAX_BUNDLE_BYTES = 32 * 1024 * 1024;

export const ImportBody = z.strictObject({
  bundle: WorkspaceBundle,
  into: z.enum(["current", "new"]).default("new").meta({ description: "Import into the current workspace (it must be empty) or into a new workspace of which you become admin." }),
  name: z.string().trim().min(1).max(120).optional().meta({ description: "Name of the new workspace; by default the bundle's workspace name." }),
});

export const ImportOut = z
  .object({
    workspace: z.object({ id: z.string(), slug: z.string(), name: z.string() }),
    imported: z.object({ models: z.number().int(), maps: z.number().int(), chains: z.number().int(), searchRecords: z.number().int() }),
  })
  .meta({ id: "ImportResult" });

export const routes: RouteConfig[] = [
  {
    method: "post",
    path: "/api/workspace/import",
    summary: "Import a workspace bundle, re-verifying every certificate first",
    description:
      "Nothing in the bundle is trusted: every certificate is checked again by the core's checker and every model's content address recomputed before anything is written, and then everything is written in one transaction. A certificate that does not verify (one changed byte breaks its seal) answers 422 naming it (field certificates.<i>), and nothing is imported. into=new (the default) creates a workspace of which the caller becomes admin; into=current needs an empty workspace.",
    tags: ["workspace"],
    security: SECURITY,
    request: { body: jsonBody(ImportBody, "The bundle, as GET /api/workspace/export wrote it.") },
    responses: {
      201: jsonBody(ImportOut, "Imported."),
      ...errorResponses("bad_input", "unauthenticated", "forbidden", "conflict", "too_large", "does_not_commute"),
    },
  },
];
