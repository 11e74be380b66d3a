import "server-only";
import { inArray, sql } from "drizzle-orm";
import { readVersions } from "@/db/schema";
import type { Database } from "@/db";
import { getDatabase, withDb } from "./connection";

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

function prepareRead(db: Database, count: number) {
  const placeholders = Array.from({ length: count }, (_, i) => sql.placeholder(`s${i}`));
  return db.select().from(readVersions).where(inArray(readVersions.scope, placeholders)).prepare();
}

// Read at every API request: prepared once per database and scope count (half the cost of building it).
const prepared = new WeakMap<Database, Map<number, ReturnType<typeof prepareRead>>>();

function statementFor(db: Database, count: number): ReturnType<typeof prepareRead> {
  let byCount = prepared.get(db);
  if (!byCount) prepared.set(db, (byCount = new Map()));
  let statement = byCount.get(count);
  if (!statement) byCount.set(count, (statement = prepareRead(db, count)));
  return statement;
}

/** The current counter of each scope, in order; 0 for a scope that was never written. */
export async function getReadVersions({ db = getDatabase(), scopes }: { db?: Database; scopes: string[] }): Promise<number[]> {
  return withDb("reading cache versions", async () => {
    const rows: { scope: string; version: number }[] = await statementFor(db, scopes.length).all(Object.fromEntries(scopes.map((scope, i) => [`s${i}`, scope])));
    const found = new Map(rows.map((r) => [r.scope, r.version]));
    return scopes.map((scope) => found.get(scope) ?? 0);
  });
}
