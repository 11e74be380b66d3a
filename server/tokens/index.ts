import "server-only";
import { getMembershipRole } from "@/db/queries/memberships";
import { createApiToken, listApiTokens, revokeApiToken, type ApiTokenView } from "@/db/queries/tokens";
import { can, isRoleWithin, refusalReason, type Role } from "@/lib/policy";
import { AppError } from "@/server/errors";
import { generateTokenSecret, hashTokenSecret, tokenDisplayPrefix } from "./secret";

export { generateTokenSecret, hashTokenSecret, TOKEN_PREFIX } from "./secret";
export type { ApiTokenView } from "@/db/queries/tokens";

/**
 * Creates a personal API token for one workspace with a role no higher than the owner's role
 * there. The secret is returned this once; only its SHA-256 is stored.
 */
export async function createPersonalToken({
  userId,
  workspaceId,
  name,
  role,
}: {
  userId: string;
  workspaceId: string;
  name: string;
  role: Role;
}): Promise<{ token: ApiTokenView; secret: string }> {
  const ownerRole = await getMembershipRole({ workspaceId, userId });
  if (!can(ownerRole, "token:manage")) throw new AppError("forbidden", refusalReason(ownerRole, "token:manage"));
  if (!ownerRole || !isRoleWithin(role, ownerRole)) {
    throw new AppError("forbidden", `A token may not exceed your own role (${ownerRole}); you asked for ${role}.`, {
      field: "role",
    });
  }
  const secret = generateTokenSecret();
  const token = await createApiToken({
    userId,
    workspaceId,
    name,
    role,
    tokenHash: hashTokenSecret(secret),
    prefix: tokenDisplayPrefix(secret),
  });
  return { token, secret };
}

export async function revokePersonalToken({ userId, tokenId }: { userId: string; tokenId: string }): Promise<ApiTokenView> {
  // read_versions triggers tell every process's actor cache (app/api/_lib/actor.ts) at once.
  return revokeApiToken({ userId, tokenId });
}

export async function listPersonalTokens({ userId, workspaceId }: { userId: string; workspaceId?: string }) {
  return listApiTokens({ userId, workspaceId });
}
