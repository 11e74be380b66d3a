import "server-only";
import { asc, count, eq } from "drizzle-orm";
import type { Role } from "@/lib/policy";
import { chains, jobs, maps, memberships, models, workspaces, type Workspace } from "../schema";
import { getDatabase, withDb, type Executor } from "./connection";

export type WorkspaceRef = Pick<Workspace, "id" | "slug" | "name">;

export async function getWorkspaceById({ id }: { id: string }, db: Executor = getDatabase()): Promise<WorkspaceRef | null> {
  return withDb("reading a workspace", async () => {
    const rows = await db
      .select({ id: workspaces.id, slug: workspaces.slug, name: workspaces.name })
      .from(workspaces)
      .where(eq(workspaces.id, id))
      .limit(1);
    return rows[0] ?? null;
  });
}

export async function getWorkspaceBySlug(
  { slug }: { slug: string },
  db: Executor = getDatabase(),
): Promise<WorkspaceRef | null> {
  return withDb("reading a workspace", async () => {
    const rows = await db
      .select({ id: workspaces.id, slug: workspaces.slug, name: workspaces.name })
      .from(workspaces)
      .where(eq(workspaces.slug, slug))
      .limit(1);
    return rows[0] ?? null;
  });
}

/** The workspaces a person belongs to with their role in each, oldest membership first. */
export async function listWorkspacesForUser(
  { userId }: { userId: string },
  db: Executor = getDatabase(),
): Promise<(WorkspaceRef & { role: Role })[]> {
  return withDb("listing workspaces", () =>
    db
      .select({ id: workspaces.id, slug: workspaces.slug, name: workspaces.name, role: memberships.role })
      .from(memberships)
      .innerJoin(workspaces, eq(workspaces.id, memberships.workspaceId))
      .where(eq(memberships.userId, userId))
      .orderBy(asc(memberships.createdAt), asc(workspaces.slug)),
  );
}

/** Seeds: the workspace with this slug, created when missing (the name is left as it is). */
export async function ensureWorkspace(
  { slug, name }: { slug: string; name: string },
  db: Executor = getDatabase(),
): Promise<WorkspaceRef> {
  return withDb("creating a workspace", async () => {
    await db.insert(workspaces).values({ slug, name }).onConflictDoNothing({ target: workspaces.slug });
    const [row] = await db
      .select({ id: workspaces.id, slug: workspaces.slug, name: workspaces.name })
      .from(workspaces)
      .where(eq(workspaces.slug, slug));
    return row;
  });
}

export type WorkspaceSummary = { members: number; models: number; maps: number; chains: number; jobs: number };

/** Counts for the dashboard. */
export async function getWorkspaceSummary(
  { workspaceId }: { workspaceId: string },
  db: Executor = getDatabase(),
): Promise<WorkspaceSummary> {
  return withDb("summarising a workspace", async () => {
    const countIn = async (table: typeof memberships | typeof models | typeof maps | typeof chains | typeof jobs) => {
      const [row] = await db.select({ n: count() }).from(table).where(eq(table.workspaceId, workspaceId));
      return row?.n ?? 0;
    };
    const [members, modelCount, mapCount, chainCount, jobCount] = await Promise.all([
      countIn(memberships),
      countIn(models),
      countIn(maps),
      countIn(chains),
      countIn(jobs),
    ]);
    return { members, models: modelCount, maps: mapCount, chains: chainCount, jobs: jobCount };
  });
}
