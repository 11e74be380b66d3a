import { auth } from "@/auth";
import { getMembershipRole } from "@/db/queries/memberships";
import { countNotes, createNote, listActivity } from "@/db/queries/notes";
import { listWorkspacesForUser } from "@/db/queries/workspaces";
import { can, refusalReason } from "@/lib/policy";
import { AppError, toResponse } from "@/server/errors";
import { NoteInput } from "@/app/dashboard/schema";
import { WORKSPACE_COOKIE } from "@/server/context";
import { cookies } from "next/headers";

/** The signed-in person's current workspace and role, or an AppError (401 signed out, 403 not a member). */
async function currentMembership() {
  const userId = (await auth())?.user?.id;
  if (!userId) throw new AppError("unauthenticated", "Sign in first.");
  const mine = await listWorkspacesForUser({ userId });
  const chosen = (await cookies()).get(WORKSPACE_COOKIE)?.value;
  const current = mine.find((w) => w.id === chosen) ?? mine[0];
  if (!current) throw new AppError("forbidden", refusalReason(null, "atlas:read"));
  // Re-read the role: the list above and this check must agree even if a grant changed in between.
  const role = await getMembershipRole({ workspaceId: current.id, userId });
  return { userId, workspaceId: current.id, role };
}

/** GET /api/notes: the workspace log. */
export async function GET() {
  try {
    const { workspaceId, role } = await currentMembership();
    if (!can(role, "atlas:read")) throw new AppError("forbidden", refusalReason(role, "atlas:read"));
    const [items, notes] = await Promise.all([listActivity({ workspaceId, limit: 50 }), countNotes({ workspaceId })]);
    return Response.json({ notes, items });
  } catch (err) {
    return toResponse(err);
  }
}

/** POST /api/notes `{ "text": "…" }`: adds a note; contributors and above. */
export async function POST(request: Request) {
  try {
    let body: unknown;
    try {
      body = await request.json();
    } catch {
      throw new AppError("bad_input", "The request body is not valid JSON.", { field: "body" });
    }
    const parsed = NoteInput.safeParse(body);
    if (!parsed.success) {
      const issue = parsed.error.issues[0];
      throw new AppError("bad_input", issue.message, { field: issue.path.length ? `body.${issue.path.join(".")}` : "body" });
    }
    const { userId, workspaceId, role } = await currentMembership();
    if (!can(role, "note:post")) throw new AppError("forbidden", refusalReason(role, "note:post"));
    const note = await createNote({ workspaceId, actorId: userId, text: parsed.data.text });
    return Response.json(note, { status: 201 });
  } catch (err) {
    return toResponse(err);
  }
}
