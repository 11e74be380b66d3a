import { z } from "zod";
import { WorkspaceBundle } from "@/server/bundle/bundle-schema";

/** Bundles are larger than ordinary request bodies: a whole atlas. */
export const MAX_BUNDLE_BYTES = 32 * 1024 * 1024;

export const ImportBody = z.strictObject({
  bundle: WorkspaceBundle,
  into: z.enum(["current", "new"]).default("new").meta({ description: "Import into the current workspace (it must be empty) or into a new workspace of which you become admin." }),
  name: z.string().trim().min(1).max(120).optional().meta({ description: "Name of the new workspace; by default the bundle's workspace name." }),
});
