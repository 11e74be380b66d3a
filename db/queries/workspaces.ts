import "server-only";
import { and, asc, count, desc, eq, inArray, not } from "drizzle-orm";
import { alias } from "drizzle-orm/sqlite-core";
import type { Role } from "@/lib/policy";
import { chains, jobs, maps, memberships, models, users, workspaces, type Workspace } from "../schema";
import { recordAuditEvent } from "./audit";
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

function slugify(text: string): string {
  const slug = text
    .toLowerCase()
    .normalize("NFKD")
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 32);
  return slug || "atlas";
}

/** Anyone may create a workspace; its creator is its first admin (one transaction). */
export async function createWorkspace({ db = getDatabase(), userId, name }: { db?: Executor; userId: string; name: string }): Promise<WorkspaceRef> {
  return withDb("creating a workspace", () =>
    db.transaction(async (tx) => {
      const slug = `${slugify(name)}-${crypto.randomUUID().slice(0, 6)}`;
      const [row] = await tx
        .insert(workspaces)
        .values({ slug, name: name.trim() })
        .returning({ id: workspaces.id, slug: workspaces.slug, name: workspaces.name });
      await tx.insert(memberships).values({ workspaceId: row.id, userId, role: "admin" });
      await recordAuditEvent({ db: tx, workspaceId: row.id, actorId: userId, action: "workspace:create", subjectType: "workspace", subjectId: row.id, detail: { name: row.name } });
      return row;
    }),
  );
}

export async function getPublicView({ db = getDatabase(), workspaceId }: { db?: Executor; workspaceId: string }): Promise<boolean> {
  return withDb("reading a workspace", async () => {
    const [row] = await db.select({ on: workspaces.publicView }).from(workspaces).where(eq(workspaces.id, workspaceId)).limit(1);
    return row?.on ?? false;
  });
}

/** Turns the public read-only view on or off (audited). */
export async function setPublicView({ db = getDatabase(), workspaceId, on, actorId }: { db?: Executor; workspaceId: string; on: boolean; actorId: string }): Promise<void> {
  await withDb("changing the public view", () =>
    db.transaction(async (tx) => {
      await tx.update(workspaces).set({ publicView: on }).where(eq(workspaces.id, workspaceId));
      await recordAuditEvent({ db: tx, workspaceId, actorId, action: "workspace:publish", subjectType: "workspace", subjectId: workspaceId, detail: { on } });
    }),
  );
}

/** The workspace with this slug when its public view is on; null otherwise (a private workspace looks absent). */
export async function getPublicWorkspace({ db = getDatabase(), slug }: { db?: Executor; slug: string }): Promise<WorkspaceRef | null> {
  return withDb("reading a workspace", async () => {
    const [row] = await db
      .select({ id: workspaces.id, slug: workspaces.slug, name: workspaces.name })
      .from(workspaces)
      .where(and(eq(workspaces.slug, slug), eq(workspaces.publicView, true)))
      .limit(1);
    return row ?? null;
  });
}

export type RecentMap = {
  id: string;
  kind: string;
  block: number | null;
  summary: string;
  sourceName: string;
  targetName: string;
  certificateAddress: string;
  authorName: string | null;
  createdAt: Date;
};

const recentSource = alias(models, "recent_source");
const recentTarget = alias(models, "recent_target");

/** The constant ECAs 0 and 255: nearly every rule coarse-grains onto them, so lists fold those maps. */
export const CONSTANT_ECA_RULES = [0, 255];

/** Which maps onto a constant ECA a recent-maps list keeps: all (default), none, or only those. */
export type ConstantTargets = "include" | "exclude" | "only";

const ontoConstant = () => and(eq(recentTarget.kind, "eca"), inArray(recentTarget.rule, CONSTANT_ECA_RULES));

function recentMapFilter(workspaceId: string, constantTargets: ConstantTargets) {
  const certified = and(eq(maps.workspaceId, workspaceId), eq(maps.status, "certified"));
  if (constantTargets === "only") return and(certified, ontoConstant());
  if (constantTargets === "exclude") return and(certified, not(ontoConstant()!));
  return certified;
}

/** The newest certified maps of a workspace (retracted ones left out), with or without those onto constant ECAs. */
export async function listRecentMaps({
  db = getDatabase(),
  workspaceId,
  limit = 10,
  constantTargets = "include",
}: {
  db?: Executor;
  workspaceId: string;
  limit?: number;
  /** @default "include" */
  constantTargets?: ConstantTargets;
}): Promise<RecentMap[]> {
  return withDb("listing recent maps", () =>
    db
      .select({
        id: maps.id,
        kind: maps.kind,
        block: maps.block,
        summary: maps.summary,
        sourceName: recentSource.name,
        targetName: recentTarget.name,
        certificateAddress: maps.certificateAddress,
        authorName: users.name,
        createdAt: maps.createdAt,
      })
      .from(maps)
      .innerJoin(recentSource, eq(recentSource.id, maps.sourceModelId))
      .innerJoin(recentTarget, eq(recentTarget.id, maps.targetModelId))
      .leftJoin(users, eq(users.id, maps.authorId))
      .where(recentMapFilter(workspaceId, constantTargets))
      .orderBy(desc(maps.createdAt), desc(maps.id))
      .limit(limit),
  );
}

/** How many certified maps of the workspace go onto a constant ECA (0 or 255). */
export async function countConstantTargetMaps({ db = getDatabase(), workspaceId }: { db?: Executor; workspaceId: string }): Promise<number> {
  return withDb("counting maps onto constant rules", async () => {
    const [row] = await db
      .select({ n: count() })
      .from(maps)
      .innerJoin(recentTarget, eq(recentTarget.id, maps.targetModelId))
      .where(recentMapFilter(workspaceId, "only"));
    return row?.n ?? 0;
  });
}

export async function listRecentChains({ db = getDatabase(), workspaceId, limit = 5 }: { db?: Executor; workspaceId: string; limit?: number }) {
  return withDb("listing recent chains", () =>
    db
      .select({ id: chains.id, name: chains.name, verification: chains.verification, authorName: users.name, createdAt: chains.createdAt })
      .from(chains)
      .leftJoin(users, eq(users.id, chains.authorId))
      .where(eq(chains.workspaceId, workspaceId))
      .orderBy(desc(chains.createdAt))
      .limit(limit),
  );
}

/** Jobs queued or running in the workspace, with their owner's name. */
export async function listActiveJobs({ db = getDatabase(), workspaceId, limit = 10 }: { db?: Executor; workspaceId: string; limit?: number }) {
  return withDb("listing running jobs", () =>
    db
      .select({ id: jobs.id, kind: jobs.kind, status: jobs.status, progress: jobs.progress, ownerName: users.name, createdAt: jobs.createdAt })
      .from(jobs)
      .leftJoin(users, eq(users.id, jobs.ownerId))
      .where(and(eq(jobs.workspaceId, workspaceId), inArray(jobs.status, ["queued", "running"])))
      .orderBy(desc(jobs.createdAt))
      .limit(limit),
  );
}

/** The models of a public workspace, by name (for the read-only view). */
export async function listPublicModels({ db = getDatabase(), workspaceId, limit = 100 }: { db?: Executor; workspaceId: string; limit?: number }) {
  return withDb("listing models", () =>
    db
      .select({ id: models.id, name: models.name, kind: models.kind, address: models.address })
      .from(models)
      .where(eq(models.workspaceId, workspaceId))
      .orderBy(asc(models.name))
      .limit(limit),
  );
}
