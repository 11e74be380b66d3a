import type { ApiTokenView } from "@/db/queries/tokens";

export function tokenJson(t: ApiTokenView) {
  return {
    id: t.id,
    name: t.name,
    prefix: t.prefix,
    role: t.role,
    workspaceId: t.workspaceId,
    lastUsedAt: t.lastUsedAt?.toISOString() ?? null,
    revokedAt: t.revokedAt?.toISOString() ?? null,
    createdAt: t.createdAt.toISOString(),
  };
}
