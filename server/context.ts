import "server-only";
import { cookies } from "next/headers";
import { redirect } from "next/navigation";
import { cache } from "react";
import { auth } from "@/auth";
import { getUserById } from "@/db/queries/users";
import { listWorkspacesForUser, type WorkspaceRef } from "@/db/queries/workspaces";
import { can, type Action, type Role } from "@/lib/policy";

export type SessionUser = { id: string; email: string; name: string };
export type WorkspaceContext = { user: SessionUser; workspace: WorkspaceRef; role: Role };

/** The cookie that remembers the workspace a person last chose. */
export const WORKSPACE_COOKIE = "squarely-ws";

/**
 * The signed-in person, re-read from the database so that a deleted account's session stops
 * working at once. Cached per request.
 */
export const getSessionUser = cache(async (): Promise<SessionUser | null> => {
  const session = await auth();
  const id = session?.user?.id;
  if (!id) return null;
  const user = await getUserById({ id });
  return user ? { id: user.id, email: user.email, name: user.name } : null;
});

export async function requireUser(): Promise<SessionUser> {
  const user = await getSessionUser();
  if (!user) redirect("/sign-in");
  return user;
}

/** All workspaces of the signed-in person with their role; empty when signed out. */
export const listMyWorkspaces = cache(async () => {
  const user = await getSessionUser();
  return user ? listWorkspacesForUser({ userId: user.id }) : [];
});

/**
 * The current workspace: the one named by the `squarely-ws` cookie when the person is a member of
 * it, else their first membership. Signed-out visitors go to /sign-in.
 */
export const getWorkspaceContext = cache(async (): Promise<WorkspaceContext> => {
  const user = await requireUser();
  const mine = await listMyWorkspaces();
  const chosen = (await cookies()).get(WORKSPACE_COOKIE)?.value;
  const current = mine.find((w) => w.id === chosen) ?? mine[0];
  if (!current) redirect("/forbidden?action=atlas:read");
  const { role, ...workspace } = current;
  return { user, workspace, role };
});

/** The workspace context when the person's role allows `action`; otherwise the 403 page says why. */
export async function requireAction(action: Action): Promise<WorkspaceContext> {
  const context = await getWorkspaceContext();
  if (!can(context.role, action)) redirect(`/forbidden?action=${encodeURIComponent(action)}`);
  return context;
}
