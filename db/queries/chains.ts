import "server-only";
import { and, asc, desc, eq, inArray, lt, or } from "drizzle-orm";
import { chainLinks, chains, maps, type Chain } from "@/db/schema";
import { AppError } from "@/server/errors";
import { recordAuditEvent } from "./audit";
import { storeCertificate, type VerifiedCertificate } from "./certificates";
import { type Executor, getDatabase, isUniqueViolation, withDb, wrapDbError } from "./connection";
import { decodeCursor, encodeCursor } from "./cursor";
import { getMap, type MapView } from "./maps";
import { notifyWatchersOfChain } from "./watches";

export type ChainView = Chain & { links: MapView[] };

/**
 * Stores a chain (ordered certified maps of this workspace) with its verified composite
 * certificate in one transaction. The same composite a second time returns the existing chain.
 */
export async function createChain({
  db = getDatabase(),
  workspaceId,
  userId,
  name,
  mapIds,
  composite,
  verification,
}: {
  db?: ReturnType<typeof getDatabase>;
  workspaceId: string;
  userId: string | null;
  name: string;
  mapIds: string[];
  composite: VerifiedCertificate;
  verification: "links" | "links+composite";
}): Promise<{ status: "created" | "existing"; chainId: string; address: string }> {
  const existing = await findChainByComposite({ db, workspaceId, address: composite.address });
  if (existing) return { status: "existing", chainId: existing.id, address: composite.address };
  try {
    return await db.transaction(async (tx) => {
      const found = await tx
        .select({ id: maps.id })
        .from(maps)
        .where(and(eq(maps.workspaceId, workspaceId), inArray(maps.id, mapIds)))
        .all();
      const known = new Set(found.map((m) => m.id));
      const missing = mapIds.findIndex((id) => !known.has(id));
      if (missing >= 0) {
        throw new AppError("not_found", `No map ${mapIds[missing]} in this workspace.`, { field: `mapIds.${missing}` });
      }
      await storeCertificate({ db: tx, certificate: composite, userId });
      const [chain] = await tx
        .insert(chains)
        .values({ workspaceId, name, compositeCertificateAddress: composite.address, verification, authorId: userId })
        .returning();
      await tx.insert(chainLinks).values(mapIds.map((mapId, position) => ({ chainId: chain.id, position, mapId })));
      await recordAuditEvent({
        db: tx,
        workspaceId,
        actorId: userId,
        action: "chain:create",
        subjectType: "chain",
        subjectId: chain.id,
        detail: { composite: composite.address, mapIds, verification },
      });
      await notifyWatchersOfChain(tx, {
        workspaceId,
        actorId: userId,
        chainId: chain.id,
        name,
        firstMapId: mapIds[0],
        lastMapId: mapIds[mapIds.length - 1],
        certificateAddress: composite.address,
        certificateBody: composite.body,
      });
      return { status: "created" as const, chainId: chain.id, address: composite.address };
    });
  } catch (err) {
    if (isUniqueViolation(err)) {
      const winner = await findChainByComposite({ db, workspaceId, address: composite.address });
      if (winner) return { status: "existing", chainId: winner.id, address: composite.address };
    }
    throw wrapDbError(err, "storing a chain");
  }
}

async function findChainByComposite({ db, workspaceId, address }: { db: Executor; workspaceId: string; address: string }) {
  return db
    .select()
    .from(chains)
    .where(and(eq(chains.workspaceId, workspaceId), eq(chains.compositeCertificateAddress, address)))
    .get();
}

export async function getChain({
  db = getDatabase(),
  workspaceId,
  chainId,
}: {
  db?: Executor;
  workspaceId: string;
  chainId: string;
}): Promise<ChainView | null> {
  return withDb("reading a chain", async () => {
    const chain = await db
      .select()
      .from(chains)
      .where(and(eq(chains.workspaceId, workspaceId), eq(chains.id, chainId)))
      .get();
    if (!chain) return null;
    const links = await db
      .select()
      .from(chainLinks)
      .where(eq(chainLinks.chainId, chainId))
      .orderBy(asc(chainLinks.position))
      .all();
    const views = await Promise.all(links.map((l) => getMap({ db, workspaceId, mapId: l.mapId })));
    return { ...chain, links: views.filter((v): v is MapView => v !== null) };
  });
}

/** Chains of a workspace, newest first. */
export async function listChains({
  db = getDatabase(),
  workspaceId,
  limit = 50,
  cursor,
}: {
  db?: Executor;
  workspaceId: string;
  limit?: number;
  cursor?: string | null;
}): Promise<{ items: Chain[]; nextCursor: string | null }> {
  return withDb("listing chains", async () => {
    const conditions = [eq(chains.workspaceId, workspaceId)];
    if (cursor) {
      const [at, id] = decodeCursor(cursor, 2);
      const when = new Date(Number(at));
      const before = or(lt(chains.createdAt, when), and(eq(chains.createdAt, when), lt(chains.id, String(id))));
      if (before) conditions.push(before);
    }
    const rows = await db
      .select()
      .from(chains)
      .where(and(...conditions))
      .orderBy(desc(chains.createdAt), desc(chains.id))
      .limit(limit + 1)
      .all();
    const items = rows.slice(0, limit);
    const last = items[items.length - 1];
    return { items, nextCursor: rows.length > limit && last ? encodeCursor([last.createdAt.getTime(), last.id]) : null };
  });
}
