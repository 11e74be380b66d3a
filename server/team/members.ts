import "server-only";
import { changeMemberRole, listMembers, removeMember, type Member } from "@/db/queries/memberships";
import type { Role } from "@/lib/policy";
import { AppError } from "@/server/errors";

const LAST_ADMIN = "A workspace needs at least one admin: make another member admin first.";

/** Changes a role or refuses with the reason: 404 not a member, 409 the last admin. */
export async function changeRole({ workspaceId, userId, role, actorId }: { workspaceId: string; userId: string; role: Role; actorId: string }): Promise<Member> {
  const result = await changeMemberRole({ workspaceId, userId, role, actorId });
  if (result === "not_member") throw new AppError("not_found", "That person is not a member of this workspace.", { field: "userId" });
  if (result === "last_admin") throw new AppError("conflict", LAST_ADMIN, { field: "role" });
  const member = (await listMembers({ workspaceId })).find((m) => m.userId === userId);
  if (!member) throw new AppError("not_found", "That person is not a member of this workspace.", { field: "userId" });
  return member;
}

export async function removeFromWorkspace({ workspaceId, userId, actorId }: { workspaceId: string; userId: string; actorId: string }): Promise<void> {
  const result = await removeMember({ workspaceId, userId, actorId });
  if (result === "not_member") throw new AppError("not_found", "That person is not a member of this workspace.", { field: "userId" });
  if (result === "last_admin") throw new AppError("conflict", LAST_ADMIN, { field: "userId" });
}
