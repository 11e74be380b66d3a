import "server-only";
import { atlasScope, getReadVersions, userScope, workspaceScope } from "@/db/queries/read-versions";
import { findActiveApiToken, touchApiToken } from "@/db/queries/tokens";
import { getUserById } from "@/db/queries/users";
import { listWorkspacesForUser } from "@/db/queries/workspaces";
import { can, refusalReason, roleRank, type Action, type Role } from "@/lib/policy";
import { AppError } from "@/server/errors";
import { sessionUserId, StampedCache, stampOf } from "@/server/read-cache";
import { hashTokenSecret } from "@/server/tokens/secret";
import { requireSameOriginWrite } from "./same-origin";

export type ActorUser = { id: string; email: string; name: string };
export type Actor = {
  user: ActorUser;
  workspace: { id: string; slug: string; name: string };
  role: Role;
  via: "session" | "token";
  tokenId?: string;
  /** The workspace's atlas counter read with this actor, before any query of the request (cached-read.ts). */
  atlasVersion?: number;
};

type SessionReader = () => Promise<ActorUser | null>;

// Tests stand in for the signed-in person; null means the app's own reading of the session cookie.
let standIn: SessionReader | null = null;

/** Tests stand in for the signed-in person; the app always reads the next-auth session cookie. */
export function setSessionReader(reader: SessionReader | null): void {
  standIn = reader;
}

const WORKSPACE_COOKIE = "squarely-ws";

function cookieValue(request: Request, name: string): string | undefined {
  for (const part of (request.headers.get("cookie") ?? "").split(";")) {
    const [key, ...rest] = part.trim().split("=");
    if (key === name) return decodeURIComponent(rest.join("="));
  }
  return undefined;
}

const SIGN_IN = "Sign in, or send a personal API token as `Authorization: Bearer <token>`.";

/**
 * Who is asking: `Authorization: Bearer <token>` when present (the token's workspace, and the
 * lower of the token's role and the owner's current role), else the session cookie (the workspace
 * chosen by the `squarely-ws` cookie when the person belongs to it, else their first). A write by
 * cookie must come from this site's pages as JSON (`requireSameOriginWrite`).
 */
export async function resolveActor(request: Request): Promise<Actor> {
  const header = request.headers.get("authorization");
  if (header !== null) return resolveToken(header);
  if (standIn) return resolveStandIn(request, standIn);
  const userId = await sessionUserId(request);
  if (!userId) throw new AppError("unauthenticated", SIGN_IN);
  const chosen = cookieValue(request, WORKSPACE_COOKIE);
  const actor = await current(`session ${userId} ${chosen ?? ""}`, () => lookUpSession(request, userId, chosen));
  requireSameOriginWrite(request);
  return actor;
}

async function resolveStandIn(request: Request, reader: SessionReader): Promise<Actor> {
  const user = await reader();
  if (!user) throw new AppError("unauthenticated", SIGN_IN);
  requireSameOriginWrite(request);
  return { ...(await pickWorkspace(user, cookieValue(request, WORKSPACE_COOKIE))), atlasVersion: undefined };
}

async function pickWorkspace(user: ActorUser, chosen: string | undefined): Promise<Actor> {
  const mine = await listWorkspacesForUser({ userId: user.id });
  const found = mine.find((w) => w.id === chosen) ?? mine[0];
  if (!found) throw new AppError("forbidden", "You are not a member of any workspace yet.");
  const { role, ...workspace } = found;
  return { user, workspace, role, via: "session" };
}

/** The signed-in person, re-read so that a deleted account's session stops working at once. */
async function lookUpSession(request: Request, userId: string, chosen: string | undefined): Promise<Actor> {
  const row = await getUserById({ id: userId });
  if (!row) throw new AppError("unauthenticated", SIGN_IN);
  requireSameOriginWrite(request);
  return pickWorkspace({ id: row.id, email: row.email, name: row.name }, chosen);
}

async function resolveToken(header: string): Promise<Actor> {
  const match = /^Bearer\s+(\S+)\s*$/i.exec(header);
  if (!match) {
    throw new AppError("unauthenticated", "The Authorization header must be `Bearer <token>`.", { field: "authorization" });
  }
  const hash = hashTokenSecret(match[1]);
  const actor = await current(`token ${hash}`, () => lookUpToken(hash));
  await noteTokenUse(actor.tokenId!);
  return actor;
}

async function lookUpToken(tokenHash: string): Promise<Actor> {
  const found = await findActiveApiToken({ tokenHash });
  if (!found) throw new AppError("unauthenticated", "This API token is unknown or revoked.", { field: "authorization" });
  tokenUse.set(found.token.id, found.token.lastUsedAt?.getTime() ?? 0);
  const role = roleRank(found.token.role) <= roleRank(found.memberRole) ? found.token.role : found.memberRole;
  return { user: found.user, workspace: found.workspace, role, via: "token", tokenId: found.token.id };
}

// When this process last saw each token's use noted in the database.
const tokenUse = new Map<string, number>();

/** A write per read would serialise every API read behind the write lock: note use once a minute. */
async function noteTokenUse(tokenId: string): Promise<void> {
  const now = Date.now();
  if (now - (tokenUse.get(tokenId) ?? 0) <= 60_000) return;
  if (tokenUse.size >= 10_000) tokenUse.clear();
  tokenUse.set(tokenId, now);
  await touchApiToken({ tokenId, now: new Date(now) }).catch(() => undefined);
}

/**
 * Resolved actors, stamped with the counters of their person and workspace (db/queries/read-versions.ts):
 * a revoked token, a changed role, a removed member or a deleted account moves a counter in the same
 * transaction, so the next request of any process looks the actor up again.
 */
const actors = new StampedCache<Actor>({ max: 10_000, ttlMs: 10 * 60_000 });

function scopesOf(actor: Actor): string[] {
  return [userScope(actor.user.id), workspaceScope(actor.workspace.id), atlasScope(actor.workspace.id)];
}

/** One indexed read of three counters per request instead of the actor's joins (and no JWE decode). */
async function current(key: string, lookUp: () => Promise<Actor>): Promise<Actor> {
  const cached = actors.peek(key);
  if (cached) {
    const versions = await getReadVersions({ scopes: scopesOf(cached.value) });
    if (stampOf(versions.slice(0, 2)) === cached.stamp) return { ...cached.value, atlasVersion: versions[2] };
  }
  const first = await lookUp();
  const versions = await getReadVersions({ scopes: scopesOf(first) });
  // Looked up again after reading the counters: a write in between moves a counter past this stamp.
  const actor = await lookUp();
  if (actor.user.id !== first.user.id || actor.workspace.id !== first.workspace.id) return actor;
  actors.set(key, stampOf(versions.slice(0, 2)), actor);
  return { ...actor, atlasVersion: versions[2] };
}

/** Tests: forget every resolved actor (as a fresh process would). */
export function forgetActors(): void {
  actors.clear();
  tokenUse.clear();
}

/** The policy check of every handler: a 403 that says which role the action needs. */
export function authorize(actor: Actor, action: Action): void {
  if (!can(actor.role, action)) throw new AppError("forbidden", refusalReason(actor.role, action), { details: { action } });
}
