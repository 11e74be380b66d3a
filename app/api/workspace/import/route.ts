import { randomBytes } from "node:crypto";
import { setMembership } from "@/db/queries/memberships";
import { ensureWorkspace } from "@/db/queries/workspaces";
import { importWorkspaceBundle, verifyBundle } from "@/server/bundle/workspace-bundle";
import { AppError } from "@/server/errors";
import { authorize, resolveActor } from "../../_lib/actor";
import { badInput, route } from "../../_lib/handler";
import { ImportBody, MAX_BUNDLE_BYTES } from "./schema";

async function readBundleBody(request: Request) {
  const declared = Number(request.headers.get("content-length") ?? "0");
  const text = declared > MAX_BUNDLE_BYTES ? null : await request.text();
  if (text === null || Buffer.byteLength(text, "utf8") > MAX_BUNDLE_BYTES) {
    throw new AppError("too_large", `A bundle may have at most ${MAX_BUNDLE_BYTES} bytes.`, { field: "body", details: { bound: "bundle bytes", limit: MAX_BUNDLE_BYTES } });
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch {
    throw new AppError("bad_input", "The request body is not valid JSON.", { field: "body" });
  }
  const parsed = ImportBody.safeParse(json);
  if (!parsed.success) throw badInput(parsed.error, "body");
  return parsed.data;
}

/**
 * Imports a workspace bundle: every certificate re-verified and every model's address recomputed
 * before anything is written; into a new workspace (the importer becomes its admin) or into the
 * current one when it is empty. 201 with counts; 422 naming the certificate that does not verify.
 */
export const POST = route(async (request) => {
  const body = await readBundleBody(request);
  const actor = await resolveActor(request);
  if (body.into === "current") authorize(actor, "certificate:submit");
  const checked = await verifyBundle(body.bundle);
  let workspace = actor.workspace;
  if (body.into === "new") {
    const name = body.name ?? body.bundle.workspace.name ?? "Imported atlas";
    workspace = await ensureWorkspace({ slug: `imported-${randomBytes(5).toString("hex")}`, name });
    await setMembership({ workspaceId: workspace.id, userId: actor.user.id, role: "admin" });
  }
  const counts = await importWorkspaceBundle({ workspaceId: workspace.id, userId: actor.user.id, checked });
  return Response.json({ workspace, imported: counts }, { status: 201 });
});
