import "server-only";
import { inArray } from "drizzle-orm";
import { readVersions } from "@/db/schema";
import { type Executor, getDatabase, withDb } from "./connection";

/** A person's row, memberships and tokens (drizzle/0007_read-versions-triggers.sql). */
export function userScope(userId: string): string {
  return `user:${userId}`;
}

/** A workspace's own row: its slug and name. */
export function workspaceScope(workspaceId: string): string {
  return `ws:${workspaceId}`;
}

/** A workspace's models, maps and chains. */
export function atlasScope(workspaceId: string): string {
  return `atlas:${workspaceId}`;
}

/** The current counter of each scope, in order; 0 for a scope that was never written. */
export async function getReadVersions({ db = getDatabase(), scopes }: { db?: Executor; scopes: string[] }): Promise<number[]> {
  return withDb("reading cache versions", async () => {
    const rows = await db.select().from(readVersions).where(inArray(readVersions.scope, scopes)).all();
    const found = new Map(rows.map((r) => [r.scope, r.version]));
    return scopes.map((scope) => found.get(scope) ?? 0);
  });
}
