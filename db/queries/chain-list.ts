import "server-only";
import { and, asc, desc, eq, inArray, or, sql } from "drizzle-orm";
import { certificates, chainLinks, chains, maps, models } from "@/db/schema";
import { getDatabase, withDb, type Executor } from "./connection";

export type ChainListItem = {
  id: string;
  name: string;
  verification: "links" | "links+composite";
  createdAt: Date;
  links: number;
  source: { id: string; name: string };
  target: { id: string; name: string };
};

/** `%`, `_` and `\` taken literally in a LIKE pattern. */
function likePattern(q: string): string {
  return `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

/**
 * One page of the workspace's chains, newest first: filtered by a part of the name and by a model that
 * any link starts or ends at. Each item carries its first source and last target.
 */
export async function searchChains({
  db = getDatabase(),
  workspaceId,
  q,
  modelId,
  page = 0,
  pageSize = 20,
}: {
  db?: Executor;
  workspaceId: string;
  q?: string;
  modelId?: string;
  page?: number;
  pageSize?: number;
}): Promise<{ items: ChainListItem[]; hasMore: boolean }> {
  return withDb("listing chains", async () => {
    const conditions = [eq(chains.workspaceId, workspaceId)];
    if (q) conditions.push(sql`${chains.name} like ${likePattern(q)} escape '\\'`);
    if (modelId) {
      const touching = db
        .select({ id: chainLinks.chainId })
        .from(chainLinks)
        .innerJoin(maps, eq(maps.id, chainLinks.mapId))
        .where(or(eq(maps.sourceModelId, modelId), eq(maps.targetModelId, modelId)));
      conditions.push(inArray(chains.id, touching));
    }
    const rows = await db
      .select()
      .from(chains)
      .where(and(...conditions))
      .orderBy(desc(chains.createdAt), desc(chains.id))
      .limit(pageSize + 1)
      .offset(page * pageSize)
      .all();
    const pageRows = rows.slice(0, pageSize);
    if (pageRows.length === 0) return { items: [], hasMore: false };
    const links = await db
      .select({ chainId: chainLinks.chainId, position: chainLinks.position, source: maps.sourceModelId, target: maps.targetModelId })
      .from(chainLinks)
      .innerJoin(maps, eq(maps.id, chainLinks.mapId))
      .where(inArray(chainLinks.chainId, pageRows.map((c) => c.id)))
      .orderBy(asc(chainLinks.chainId), asc(chainLinks.position))
      .all();
    const modelIds = [...new Set(links.flatMap((l) => [l.source, l.target]))];
    const names = new Map(
      (await db.select({ id: models.id, name: models.name }).from(models).where(inArray(models.id, modelIds)).all()).map((m) => [m.id, m.name]),
    );
    const items = pageRows.map((c) => {
      const mine = links.filter((l) => l.chainId === c.id);
      const first = mine[0]?.source ?? "";
      const last = mine[mine.length - 1]?.target ?? "";
      return {
        id: c.id,
        name: c.name,
        verification: c.verification,
        createdAt: c.createdAt,
        links: mine.length,
        source: { id: first, name: names.get(first) ?? "?" },
        target: { id: last, name: names.get(last) ?? "?" },
      };
    });
    return { items, hasMore: rows.length > pageSize };
  });
}

/** The models that some chain of the workspace passes through, by name: the choices of the model filter. */
export async function listChainModels({ db = getDatabase(), workspaceId }: { db?: Executor; workspaceId: string }): Promise<{ id: string; name: string; kind: string; address: string }[]> {
  return withDb("listing chain models", async () => {
    const rows = await db
      .selectDistinct({ id: models.id, name: models.name, kind: models.kind, address: models.address })
      .from(chainLinks)
      .innerJoin(chains, eq(chains.id, chainLinks.chainId))
      .innerJoin(maps, eq(maps.id, chainLinks.mapId))
      .innerJoin(models, or(eq(models.id, maps.sourceModelId), eq(models.id, maps.targetModelId)))
      .where(eq(chains.workspaceId, workspaceId))
      .all();
    return rows.sort((a, b) => a.name.localeCompare(b.name, "en", { numeric: true }));
  });
}

export type CompositeEdge = ChainListItem & { compositeKind: string; compositeBlock: number | null; compositeAddress: string };

/**
 * Certified chains whose composite starts or ends at a model: edges of the atlas of their own,
 * marked as composites and linked to their chain (the composite certificate gives kind and block).
 */
export async function listCompositeEdges({ db = getDatabase(), workspaceId, modelId }: { db?: Executor; workspaceId: string; modelId: string }): Promise<CompositeEdge[]> {
  const { items } = await searchChains({ db, workspaceId, modelId, pageSize: 100 });
  return withComposites(
    db,
    items.filter((c) => c.source.id === modelId || c.target.id === modelId),
  );
}

/**
 * The newest certified chains of a workspace as composite edges, for the atlas's maps list: filtered
 * by the composite's kind and block, and by a part of the chain's or its end models' names.
 */
export async function listWorkspaceComposites({
  db = getDatabase(),
  workspaceId,
  kind,
  block,
  q,
  limit = 40,
}: {
  db?: Executor;
  workspaceId: string;
  kind?: string;
  block?: number;
  q?: string;
  limit?: number;
}): Promise<CompositeEdge[]> {
  const { items } = await searchChains({ db, workspaceId, pageSize: 200 });
  const needle = q?.trim().toLowerCase();
  const named = needle ? items.filter((c) => [c.name, c.source.name, c.target.name].some((n) => n.toLowerCase().includes(needle))) : items;
  const edges = await withComposites(db, named);
  return edges.filter((e) => (kind === undefined || e.compositeKind === kind) && (block === undefined || e.compositeBlock === block)).slice(0, limit);
}

async function withComposites(db: Executor, ends: ChainListItem[]): Promise<CompositeEdge[]> {
  if (ends.length === 0) return [];
  return withDb("reading composite certificates", async () => {
    const rows = await db
      .select({ id: chains.id, address: certificates.address, kind: certificates.kind, body: certificates.body })
      .from(chains)
      .innerJoin(certificates, eq(certificates.address, chains.compositeCertificateAddress))
      .where(inArray(chains.id, ends.map((c) => c.id)))
      .all();
    const byChain = new Map(rows.map((r) => [r.id, r]));
    return ends.map((c) => {
      const row = byChain.get(c.id);
      const block = row ? (JSON.parse(row.body) as { map?: { block?: unknown } }).map?.block : null;
      return { ...c, compositeKind: row?.kind ?? "composite", compositeBlock: typeof block === "number" ? block : null, compositeAddress: row?.address ?? "" };
    });
  });
}
