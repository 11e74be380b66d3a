import "server-only";
import { and, asc, desc, eq, isNull, lt, or } from "drizzle-orm";
import { apiTokens, memberships, users, workspaces, type ApiToken } from "@/db/schema";
import type { Role } from "@/lib/policy";
import { AppError } from "@/server/errors";
import { recordAuditEvent } from "./audit";
import { type Executor, getDatabase, withDb } from "./connection";

/** A token listed to its owner: never the hash. */
export type ApiTokenView = Omit<ApiToken, "tokenHash">;

export type TokenActor = {
  token: ApiTokenView;
  user: { id: string; email: string; name: string };
  workspace: { id: string; slug: string; name: string };
  /** The owner's current role in the workspace; the effective role is the lower of this and the token's. */
  memberRole: Role;
};

function view({ tokenHash: _hash, ...rest }: ApiToken): ApiTokenView {
  return rest;
}

export async function createApiToken({
  db = getDatabase(),
  userId,
  workspaceId,
  name,
  role,
  tokenHash,
  prefix,
}: {
  db?: ReturnType<typeof getDatabase>;
  userId: string;
  workspaceId: string;
  name: string;
  role: Role;
  tokenHash: string;
  prefix: string;
}): Promise<ApiTokenView> {
  return withDb("creating a token", () =>
    db.transaction(async (tx) => {
      const [row] = await tx.insert(apiTokens).values({ userId, workspaceId, name, role, tokenHash, prefix }).returning();
      await recordAuditEvent({
        db: tx,
        workspaceId,
        actorId: userId,
        action: "token:create",
        subjectType: "api_token",
        subjectId: row.id,
        detail: { name, role, prefix },
      });
      return view(row);
    }),
  );
}

/** A person's tokens (all workspaces, or one), newest first, revoked ones included. */
export async function listApiTokens({
  db = getDatabase(),
  userId,
  workspaceId,
}: {
  db?: Executor;
  userId: string;
  workspaceId?: string;
}): Promise<ApiTokenView[]> {
  return withDb("listing tokens", async () => {
    const c = [eq(apiTokens.userId, userId)];
    if (workspaceId) c.push(eq(apiTokens.workspaceId, workspaceId));
    const rows = await db
      .select()
      .from(apiTokens)
      .where(and(...c))
      .orderBy(desc(apiTokens.createdAt), asc(apiTokens.id))
      .all();
    return rows.map(view);
  });
}

/** Revokes one of the person's own tokens; another person's token is "not found". */
export async function revokeApiToken({
  db = getDatabase(),
  userId,
  tokenId,
}: {
  db?: ReturnType<typeof getDatabase>;
  userId: string;
  tokenId: string;
}): Promise<ApiTokenView> {
  return withDb("revoking a token", () =>
    db.transaction(async (tx) => {
      const row = await tx
        .select()
        .from(apiTokens)
        .where(and(eq(apiTokens.id, tokenId), eq(apiTokens.userId, userId)))
        .get();
      if (!row) throw new AppError("not_found", `You have no token ${tokenId}.`, { field: "id" });
      if (row.revokedAt) return view(row);
      const [updated] = await tx
        .update(apiTokens)
        .set({ revokedAt: new Date() })
        .where(eq(apiTokens.id, tokenId))
        .returning();
      await recordAuditEvent({
        db: tx,
        workspaceId: row.workspaceId,
        actorId: userId,
        action: "token:revoke",
        subjectType: "api_token",
        subjectId: row.id,
        detail: { prefix: row.prefix },
      });
      return view(updated);
    }),
  );
}

/**
 * The unrevoked token with this hash, its owner, workspace and the owner's current role there;
 * null when the token is unknown, revoked, or its owner has left the workspace.
 */
export async function findActiveApiToken({
  db = getDatabase(),
  tokenHash,
}: {
  db?: Executor;
  tokenHash: string;
}): Promise<TokenActor | null> {
  return withDb("reading a token", async () => {
    const row = await db
      .select({
        token: apiTokens,
        user: { id: users.id, email: users.email, name: users.name },
        workspace: { id: workspaces.id, slug: workspaces.slug, name: workspaces.name },
        memberRole: memberships.role,
      })
      .from(apiTokens)
      .innerJoin(users, eq(users.id, apiTokens.userId))
      .innerJoin(workspaces, eq(workspaces.id, apiTokens.workspaceId))
      .innerJoin(
        memberships,
        and(eq(memberships.userId, apiTokens.userId), eq(memberships.workspaceId, apiTokens.workspaceId)),
      )
      .where(and(eq(apiTokens.tokenHash, tokenHash), isNull(apiTokens.revokedAt)))
      .get();
    return row ? { ...row, token: view(row.token) } : null;
  });
}

/** Notes that a token was used, at most once a minute so that reads stay reads. */
export async function touchApiToken({
  db = getDatabase(),
  tokenId,
  now = new Date(),
}: {
  db?: Executor;
  tokenId: string;
  now?: Date;
}): Promise<void> {
  await withDb("noting token use", async () => {
    const stale = new Date(now.getTime() - 60_000);
    await db
      .update(apiTokens)
      .set({ lastUsedAt: now })
      .where(and(eq(apiTokens.id, tokenId), or(isNull(apiTokens.lastUsedAt), lt(apiTokens.lastUsedAt, stale))));
  });
}

/** A person's workspaces with their role in each, oldest membership first. */
export async function listMembershipsOf({
  db = getDatabase(),
  userId,
}: {
  db?: Executor;
  userId: string;
}): Promise<{ workspace: { id: string; slug: string; name: string }; role: Role }[]> {
  return withDb("reading memberships", () =>
    db
      .select({
        workspace: { id: workspaces.id, slug: workspaces.slug, name: workspaces.name },
        role: memberships.role,
      })
      .from(memberships)
      .innerJoin(workspaces, eq(workspaces.id, memberships.workspaceId))
      .where(eq(memberships.userId, userId))
      .orderBy(asc(memberships.createdAt))
      .all(),
  );
}
