import "server-only";
import { findActiveApiToken, touchApiToken } from "@/db/queries/tokens";
import { listWorkspacesForUser } from "@/db/queries/workspaces";
import { can, refusalReason, roleRank, type Action, type Role } from "@/lib/policy";
import { AppError } from "@/server/errors";
import { cachedToken, rememberToken } from "@/server/tokens/cache";
import { hashTokenSecret } from "@/server/tokens/secret";
import { requireSameOriginWrite } from "./same-origin";

export type ActorUser = { id: string; email: string; name: string };
export type Actor = {
  user: ActorUser;
  workspace: { id: string; slug: string; name: string };
  role: Role;
  via: "session" | "token";
  tokenId?: string;
};

type SessionReader = () => Promise<ActorUser | null>;

// Loaded on first use so that handlers tested without a server never import next-auth.
let readSession: SessionReader = async () => (await import("@/server/context")).getSessionUser();

/** Tests stand in for the signed-in person; the app always reads the next-auth session. */
export function setSessionReader(reader: SessionReader | null): void {
  readSession = reader ?? (async () => (await import("@/server/context")).getSessionUser());
}

const WORKSPACE_COOKIE = "squarely-ws";

function cookieValue(request: Request, name: string): string | undefined {
  for (const part of (request.headers.get("cookie") ?? "").split(";")) {
    const [key, ...rest] = part.trim().split("=");
    if (key === name) return decodeURIComponent(rest.join("="));
  }
  return undefined;
}

/**
 * Who is asking: `Authorization: Bearer <token>` when present (the token's workspace, and the
 * lower of the token's role and the owner's current role), else the session cookie (the workspace
 * chosen by the `squarely-ws` cookie when the person belongs to it, else their first). A write by
 * cookie must come from this site's pages as JSON (`requireSameOriginWrite`).
 */
export async function resolveActor(request: Request): Promise<Actor> {
  const header = request.headers.get("authorization");
  if (header !== null) return resolveToken(header);
  const user = await readSession();
  if (!user) throw new AppError("unauthenticated", "Sign in, or send a personal API token as `Authorization: Bearer <token>`.");
  requireSameOriginWrite(request);
  const mine = await listWorkspacesForUser({ userId: user.id });
  const chosen = cookieValue(request, WORKSPACE_COOKIE);
  const current = mine.find((w) => w.id === chosen) ?? mine[0];
  if (!current) throw new AppError("forbidden", "You are not a member of any workspace yet.");
  const { role, ...workspace } = current;
  return { user, workspace, role, via: "session" };
}

async function resolveToken(header: string): Promise<Actor> {
  const match = /^Bearer\s+(\S+)\s*$/i.exec(header);
  if (!match) {
    throw new AppError("unauthenticated", "The Authorization header must be `Bearer <token>`.", { field: "authorization" });
  }
  const hash = hashTokenSecret(match[1]);
  const cached = cachedToken<Actor>(hash);
  if (cached) return cached;
  const actor = await lookUpToken(hash);
  rememberToken(hash, actor);
  return actor;
}

async function lookUpToken(tokenHash: string): Promise<Actor> {
  const found = await findActiveApiToken({ tokenHash });
  if (!found) throw new AppError("unauthenticated", "This API token is unknown or revoked.", { field: "authorization" });
  // A write per read would serialise every API read behind the write lock: note use once a minute.
  const lastUsed = found.token.lastUsedAt?.getTime() ?? 0;
  if (Date.now() - lastUsed > 60_000) await touchApiToken({ tokenId: found.token.id }).catch(() => undefined);
  const role = roleRank(found.token.role) <= roleRank(found.memberRole) ? found.token.role : found.memberRole;
  return { user: found.user, workspace: found.workspace, role, via: "token", tokenId: found.token.id };
}

/** The policy check of every handler: a 403 that says which role the action needs. */
export function authorize(actor: Actor, action: Action): void {
  if (!can(actor.role, action)) throw new AppError("forbidden", refusalReason(actor.role, action), { details: { action } });
}
