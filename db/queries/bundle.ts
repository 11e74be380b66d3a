import "server-only";
import { and, asc, eq, inArray, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/sqlite-core";
import { certificates, chainLinks, chains, maps, models, searchRecords, type MAP_KINDS } from "@/db/schema";
import { recordAuditEvent } from "./audit";
import { getDatabase, withDb } from "./connection";
import { type ModelFields, upsertModel } from "./models";

/** Everything a workspace holds that a bundle carries, read in stable orders (addresses), ids left out. */
export type WorkspaceContents = {
  models: { address: string; name: string; description: string; tags: string; canonical: string }[];
  certificates: { address: string; body: string }[];
  maps: {
    certificateAddress: string;
    status: "certified" | "retracted";
    retractedReason: string | null;
    retractedAt: Date | null;
    derivation: string | null;
    derivedFromCertificate: string | null;
    sourceAddress: string;
    targetAddress: string;
    kind: string;
    block: number | null;
    steps: number | null;
  }[];
  chains: { name: string; compositeCertificateAddress: string; verification: "links" | "links+composite"; links: string[] }[];
  searchRecords: { modelAddress: string; kind: string; maxBlock: number | null; algorithm: string; algorithmVersion: string; coverage: string; outcome: string; found: number }[];
};

const origin = alias(maps, "origin");
const sourceModel = alias(models, "bundle_source");
const targetModel = alias(models, "bundle_target");

/** Reads one workspace's models, certificates (of its maps and chains), maps, chains and search records. */
export async function readWorkspaceContents({ db = getDatabase(), workspaceId }: { db?: ReturnType<typeof getDatabase>; workspaceId: string }): Promise<WorkspaceContents> {
  return withDb("reading a workspace for export", async () => {
    const modelRows = await db
      .select({ address: models.address, name: models.name, description: models.description, tags: models.tags, canonical: models.canonical })
      .from(models)
      .where(eq(models.workspaceId, workspaceId))
      .orderBy(asc(models.address))
      .all();
    const mapRows = await db
      .select({
        certificateAddress: maps.certificateAddress,
        status: maps.status,
        retractedReason: maps.retractedReason,
        retractedAt: maps.retractedAt,
        derivation: maps.derivation,
        derivedFromCertificate: origin.certificateAddress,
        sourceAddress: sourceModel.address,
        targetAddress: targetModel.address,
        kind: maps.kind,
        block: maps.block,
        steps: maps.steps,
      })
      .from(maps)
      .innerJoin(sourceModel, eq(sourceModel.id, maps.sourceModelId))
      .innerJoin(targetModel, eq(targetModel.id, maps.targetModelId))
      .leftJoin(origin, eq(origin.id, maps.derivedFromMapId))
      .where(eq(maps.workspaceId, workspaceId))
      .orderBy(asc(maps.certificateAddress))
      .all();
    const chainRows = await db.select().from(chains).where(eq(chains.workspaceId, workspaceId)).orderBy(asc(chains.compositeCertificateAddress)).all();
    const links = chainRows.length
      ? await db
          .select({ chainId: chainLinks.chainId, position: chainLinks.position, address: maps.certificateAddress })
          .from(chainLinks)
          .innerJoin(maps, eq(maps.id, chainLinks.mapId))
          .where(inArray(chainLinks.chainId, chainRows.map((c) => c.id)))
          .orderBy(asc(chainLinks.position))
          .all()
      : [];
    const addresses = [...new Set([...mapRows.map((m) => m.certificateAddress), ...chainRows.map((c) => c.compositeCertificateAddress)])];
    const certificateRows = addresses.length
      ? await db.select({ address: certificates.address, body: certificates.body }).from(certificates).where(inArray(certificates.address, addresses)).orderBy(asc(certificates.address)).all()
      : [];
    const recordRows = await db
      .select({
        modelAddress: models.address,
        kind: searchRecords.kind,
        maxBlock: searchRecords.maxBlock,
        algorithm: searchRecords.algorithm,
        algorithmVersion: searchRecords.algorithmVersion,
        coverage: searchRecords.coverage,
        outcome: searchRecords.outcome,
        found: searchRecords.found,
      })
      .from(searchRecords)
      .innerJoin(models, eq(models.id, searchRecords.modelId))
      .where(eq(searchRecords.workspaceId, workspaceId))
      .orderBy(asc(models.address), asc(searchRecords.kind), asc(searchRecords.algorithm), asc(searchRecords.coverage), asc(searchRecords.outcome), asc(searchRecords.createdAt))
      .all();
    return {
      models: modelRows,
      certificates: certificateRows,
      maps: mapRows,
      chains: chainRows.map((c) => ({
        name: c.name,
        compositeCertificateAddress: c.compositeCertificateAddress,
        verification: c.verification,
        links: links.filter((l) => l.chainId === c.id).map((l) => l.address),
      })),
      searchRecords: recordRows,
    };
  });
}

/** True when a workspace has no models, maps, chains or search records (an import needs an empty one). */
export async function isWorkspaceEmpty({ db = getDatabase(), workspaceId }: { db?: ReturnType<typeof getDatabase>; workspaceId: string }): Promise<boolean> {
  return withDb("checking a workspace is empty", async () => {
    const n = await db.select({ n: sql<number>`count(*)` }).from(models).where(eq(models.workspaceId, workspaceId)).get();
    return (n?.n ?? 0) === 0;
  });
}

/** Rows in groups small enough for one multi-row INSERT (SQLite binds at most 32,766 parameters). */
function chunks<T>(rows: T[], size = 100): T[][] {
  const out: T[][] = [];
  for (let i = 0; i < rows.length; i += size) out.push(rows.slice(i, i + size));
  return out;
}

/** A certificate the server has just re-verified, with the fields the core derived from it. */
export type ImportCertificate = {
  address: string;
  body: string;
  kind: (typeof MAP_KINDS)[number];
  formatVersion: number;
  checkerVersion: string;
  block: number | null;
  steps: number | null;
  summary: string;
  source: ModelFields;
  target: ModelFields;
};

export type ImportInput = {
  db?: ReturnType<typeof getDatabase>;
  workspaceId: string;
  userId: string;
  /** Models re-derived from their canonical form by the core, with the bundle's name, description and tags. */
  models: { fields: ModelFields; name: string; description: string; tags: string[] }[];
  /** Every certificate, re-verified. */
  certificates: Map<string, ImportCertificate>;
  maps: Pick<WorkspaceContents["maps"][number], "certificateAddress" | "status" | "retractedReason" | "retractedAt" | "derivation" | "derivedFromCertificate">[];
  chains: WorkspaceContents["chains"];
  searchRecords: (Omit<WorkspaceContents["searchRecords"][number], "coverage" | "outcome"> & { coverage: string; outcome: string })[];
};

/**
 * Writes an imported bundle into an empty workspace in one transaction: certificates (global, kept
 * if present), models, maps (status and retraction kept), chains and search records. Anything that
 * fails rolls everything back, so an import is all or nothing.
 */
export async function writeWorkspaceImport(input: ImportInput): Promise<{ models: number; maps: number; chains: number; searchRecords: number }> {
  const { db = getDatabase(), workspaceId, userId } = input;
  return withDb("importing a workspace", () =>
    db.transaction(async (tx) => {
      const now = new Date();
      for (const chunk of chunks([...input.certificates.values()])) {
        await tx
          .insert(certificates)
          .values(chunk.map((c) => ({ address: c.address, kind: c.kind, formatVersion: c.formatVersion, body: c.body, checkerVersion: c.checkerVersion, verifiedAt: now, createdBy: userId })))
          .onConflictDoNothing();
      }
      const idOf = new Map<string, string>();
      const store = async (fields: ModelFields) => {
        const { model } = await upsertModel({ db: tx, workspaceId, model: fields, userId });
        idOf.set(model.address, model.id);
        return model;
      };
      // Plain models in bulk (the workspace is empty, so none exists yet); derived ones with their base, one by one.
      for (const chunk of chunks(input.models.filter((m) => !m.fields.base))) {
        const rows = await tx
          .insert(models)
          .values(
            chunk.map(({ fields: f, name, description, tags }) => ({
              workspaceId,
              address: f.address,
              kind: f.kind,
              name,
              description,
              canonical: f.canonical,
              rule: f.rule ?? null,
              alphabet: f.alphabet ?? null,
              radius: f.radius ?? null,
              states: f.states ?? null,
              block: f.block ?? null,
              steps: f.steps ?? null,
              symmetryClass: f.symmetryClass ?? null,
              tags: JSON.stringify(tags),
              createdBy: userId,
            })),
          )
          .onConflictDoNothing({ target: [models.workspaceId, models.address] })
          .returning({ id: models.id, address: models.address });
        for (const r of rows) idOf.set(r.address, r.id);
      }
      for (const m of input.models.filter((x) => x.fields.base)) {
        const row = await store(m.fields);
        await tx.update(models).set({ name: m.name, description: m.description, tags: JSON.stringify(m.tags) }).where(eq(models.id, row.id));
      }
      const mapIdOf = new Map<string, string>();
      const mapRows = [];
      for (const m of input.maps) {
        const c = input.certificates.get(m.certificateAddress)!;
        const source = idOf.get(c.source.address) ?? (await store(c.source)).id;
        const target = idOf.get(c.target.address) ?? (await store(c.target)).id;
        mapRows.push({
            workspaceId,
            sourceModelId: source,
            targetModelId: target,
            kind: c.kind,
            block: c.block,
            steps: c.steps,
            summary: c.summary,
            certificateAddress: c.address,
            authorId: userId,
            status: m.status,
            retractedReason: m.retractedReason,
            retractedAt: m.retractedAt,
            derivation: (m.derivation as "reflect" | "complement" | "reflect-complement" | null) ?? null,
        });
      }
      for (const chunk of chunks(mapRows)) {
        const rows = await tx.insert(maps).values(chunk).returning({ id: maps.id, address: maps.certificateAddress });
        for (const r of rows) mapIdOf.set(r.address, r.id);
      }
      for (const m of input.maps) {
        if (!m.derivedFromCertificate) continue;
        await tx
          .update(maps)
          .set({ derivedFromMapId: mapIdOf.get(m.derivedFromCertificate) ?? null })
          .where(and(eq(maps.workspaceId, workspaceId), eq(maps.certificateAddress, m.certificateAddress)));
      }
      for (const ch of input.chains) {
        const [row] = await tx
          .insert(chains)
          .values({ workspaceId, name: ch.name, compositeCertificateAddress: ch.compositeCertificateAddress, verification: ch.verification, authorId: userId })
          .returning({ id: chains.id });
        await tx.insert(chainLinks).values(ch.links.map((address, position) => ({ chainId: row.id, position, mapId: mapIdOf.get(address)! })));
      }
      const recordRows = input.searchRecords.flatMap((r) => {
        const modelId = idOf.get(r.modelAddress);
        return modelId ? [{ workspaceId, modelId, kind: r.kind, maxBlock: r.maxBlock, algorithm: r.algorithm, algorithmVersion: r.algorithmVersion, coverage: r.coverage, outcome: r.outcome, found: r.found, createdBy: userId }] : [];
      });
      for (const chunk of chunks(recordRows)) await tx.insert(searchRecords).values(chunk);
      await recordAuditEvent({
        db: tx,
        workspaceId,
        actorId: userId,
        action: "workspace:import",
        subjectType: "workspace",
        subjectId: workspaceId,
        detail: { models: idOf.size, maps: input.maps.length, chains: input.chains.length, searchRecords: input.searchRecords.length },
      });
      return { models: idOf.size, maps: input.maps.length, chains: input.chains.length, searchRecords: input.searchRecords.length };
    }),
  );
}
