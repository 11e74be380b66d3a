import "server-only";
import { and, asc, count, desc, eq, gt, inArray, not, or, sql, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/sqlite-core";
import { certificates, maps, models, searchRecords, type Model, type SearchRecord } from "@/db/schema";
import { type Executor, getDatabase, withDb } from "./connection";
import { decodeCursor, encodeCursor } from "./cursor";
import type { MapKind, MapView } from "./maps";
import { rarestTrigramPhrase } from "./trigram-rarest";
import { afterModelCursor, modelCursor, modelOrder, type ModelKind } from "./models";
import { CONSTANT_ECA_RULES, type ConstantTargets } from "./workspaces";

export type AtlasSearch = {
  db?: Executor;
  workspaceId: string;
  /** What to list: models (nodes) or maps (edges). */
  target: "models" | "maps";
  /** Free text: part of a name, a summary, or a full `sha256:` address. */
  q?: string;
  rule?: number;
  symmetryClass?: number;
  tag?: string;
  block?: number;
  mapKind?: MapKind;
  modelKind?: ModelKind;
  includeRetracted?: boolean;
  /**
   * Maps onto a constant ECA (0, 255), which nearly every rule coarse-grains onto: kept (default),
   * left out (and counted, for a "show them" line), or the only ones listed.
   */
  constantTargets?: ConstantTargets;
  limit?: number;
  cursor?: string | null;
};

export type AtlasSearchResult =
  | { target: "models"; items: Model[]; nextCursor: string | null }
  /**
   * Each map with its projection or partition as JSON text, so that a list can show what the map is,
   * and the source's state labels as JSON text (a chain's), to name the partition's states.
   */
  | {
      target: "maps";
      items: (MapView & { definition: string | null; sourceLabels: string | null })[];
      nextCursor: string | null;
      /** With `constantTargets: "exclude"`: how many maps matching the other filters go onto a constant ECA. */
      constantFolded?: number;
    };

function likeEscaped(column: SQL, text: string): SQL {
  const pattern = `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
  return sql`${column} LIKE ${pattern} ESCAPE '\\'`;
}

/** Tags are stored as a JSON array of strings; match one element exactly. */
function hasTag(tags: SQL, tag: string): SQL {
  return sql`EXISTS (SELECT 1 FROM json_each(${tags}) WHERE json_each.value = ${tag})`;
}

/**
 * Search by name, rule number, symmetry class, tag, block size, model kind and map kind, one
 * page at a time (cursor = the last row's sort key). Map searches match their source model's
 * rule, class and tag, and either end's name.
 */
export async function searchAtlas(search: AtlasSearch): Promise<AtlasSearchResult> {
  return search.target === "models" ? searchModels(search) : searchMaps(search);
}

async function searchModels({
  db = getDatabase(),
  workspaceId,
  q,
  rule,
  symmetryClass,
  tag,
  block,
  modelKind,
  limit = 50,
  cursor,
}: AtlasSearch): Promise<AtlasSearchResult> {
  return withDb("searching models", async () => {
    const c: SQL[] = [eq(models.workspaceId, workspaceId)];
    const short = q ? shortTerm(q) : null;
    if (short) c.push(or(sql`${models}.rowid IN (SELECT rowid FROM models_words WHERE models_words MATCH ${short})`, likeEscaped(sql`${models.description}`, q!))!);
    else if (q) c.push(q.startsWith("sha256:") ? eq(models.address, q) : or(likeEscaped(sql`${models.name}`, q), likeEscaped(sql`${models.description}`, q))!);
    // Descriptions are not in the trigram index: only a term that no description holds may use it.
    const byName = q && !short && !q.startsWith("sha256:") ? await modelNameCandidates(db, workspaceId, q) : null;
    if (byName) c.push(sql`${models}.rowid IN (SELECT value FROM json_each(${JSON.stringify(byName)}))`);
    if (rule !== undefined) c.push(eq(models.rule, rule));
    if (symmetryClass !== undefined) c.push(eq(models.symmetryClass, symmetryClass));
    if (tag) c.push(hasTag(sql`${models.tags}`, tag));
    if (block !== undefined) c.push(eq(models.block, block));
    if (modelKind) c.push(eq(models.kind, modelKind));
    if (cursor) c.push(afterModelCursor(cursor));
    const rows = await db
      .select()
      .from(models)
      .where(and(...c))
      .orderBy(...modelOrder)
      .limit(limit + 1)
      .all();
    const items = rows.slice(0, limit);
    const last = items[items.length - 1];
    return { target: "models", items, nextCursor: rows.length > limit && last ? modelCursor(last) : null };
  });
}

/**
 * Rowids of the workspace's models whose name contains `q`, from the trigram index, when no
 * model's description could match instead (descriptions are few and short: one LIKE over them).
 * Null when the index cannot answer or the term is common.
 */
async function modelNameCandidates(db: Executor, workspaceId: string, q: string): Promise<number[] | null> {
  if ([...q].length < 3 || /[\\%_]/.test(q)) return null;
  const pattern = `%${q}%`;
  const [described] = await db.all<{ n: number }>(
    sql`SELECT count(*) AS n FROM models WHERE workspace_id = ${workspaceId} AND description != '' AND description LIKE ${pattern}`,
  );
  if (Number(described.n) > 0) return null;
  const rows = await db.all<{ r: number }>(sql`SELECT rowid AS r FROM models_trigrams WHERE name LIKE ${pattern} LIMIT ${TRIGRAM_CANDIDATES + 1}`);
  return rows.length > TRIGRAM_CANDIDATES ? null : rows.map((row) => Number(row.r));
}

/**
 * A term of one or two letters or digits, which the trigram indexes cannot serve, as an FTS5 query
 * for the word indexes (drizzle/0006_short-search.sql): "a word begins with q". Such a term matches
 * the start of a word rather than any part of the text (inside words, one or two characters match
 * nearly everything). Null for any other term.
 */
function shortTerm(q: string): string | null {
  return [...q].length <= 2 && /^[\p{L}\p{N}]+$/u.test(q) ? `"${q}"*` : null;
}

const source = alias(models, "s");
const target = alias(models, "t");

/** Beyond this many candidate maps a term is common, and the plain search is the faster one. */
const TRIGRAM_CANDIDATES = 4000;

/**
 * The rowids of the maps whose summary, or either end's name, contains `q`, from the trigram
 * indexes (drizzle/0005_search-trigrams.sql): a few milliseconds where the LIKE scan of every map
 * of a large atlas took hundreds. Null when the index cannot answer (fewer than three characters,
 * or a LIKE wildcard or escape in `q`, which the index does not serve) or the term is common.
 */
async function trigramCandidates(db: Executor, workspaceId: string, q: string): Promise<number[] | null> {
  if ([...q].length < 3 || /[\\%_]/.test(q)) return null;
  const pattern = `%${q}%`;
  return candidateMaps(db, workspaceId, {
    summaries: sql`SELECT rowid AS r FROM maps WHERE rowid IN (SELECT rowid FROM maps_trigrams WHERE maps_trigrams MATCH ${await rarestTrigramPhrase(db, q)}) AND summary LIKE ${pattern}`,
    names: sql`SELECT rowid FROM models_trigrams WHERE name LIKE ${pattern}`,
  });
}

/**
 * The rowids of the maps whose summary, or either end's name, has a word beginning with the short
 * term `match`, from the word indexes; null when the term is common (the search then walks the
 * maps in order and stops at the page's end).
 */
function wordCandidates(db: Executor, workspaceId: string, match: string): Promise<number[] | null> {
  return candidateMaps(db, workspaceId, {
    summaries: sql`SELECT rowid AS r FROM maps_words WHERE maps_words MATCH ${match}`,
    names: sql`SELECT rowid FROM models_words WHERE models_words MATCH ${match}`,
  });
}

/**
 * The maps among the index hits `summaries` (map rowids as r) or with an end among `names` (model
 * rowids), at most TRIGRAM_CANDIDATES of them; null when there are more.
 */
async function candidateMaps(db: Executor, workspaceId: string, hits: { summaries: SQL; names: SQL }): Promise<number[] | null> {
  const cap = TRIGRAM_CANDIDATES + 1;
  const bySummary = await db.all<{ r: number }>(sql`${hits.summaries} LIMIT ${cap}`);
  if (bySummary.length > TRIGRAM_CANDIDATES) return null;
  // Subqueries, not joins: joined, SQLite walks the workspace's rows and probes the index per row.
  const byName = await db.all<{ r: number }>(
    sql`SELECT rowid AS r FROM maps WHERE workspace_id = ${workspaceId} AND (
          source_model_id IN (SELECT id FROM models WHERE workspace_id = ${workspaceId} AND rowid IN (${hits.names} LIMIT ${cap}))
          OR target_model_id IN (SELECT id FROM models WHERE workspace_id = ${workspaceId} AND rowid IN (${hits.names} LIMIT ${cap})))
        LIMIT ${cap}`,
  );
  const rowids = new Set([...bySummary, ...byName].map((row) => Number(row.r)));
  return rowids.size > TRIGRAM_CANDIDATES ? null : [...rowids];
}

async function searchMaps({
  db = getDatabase(),
  workspaceId,
  q,
  rule,
  symmetryClass,
  tag,
  block,
  mapKind,
  modelKind,
  includeRetracted = false,
  constantTargets = "include",
  limit = 50,
  cursor,
}: AtlasSearch): Promise<AtlasSearchResult> {
  return withDb("searching maps", async () => {
    const folding = constantTargets === "exclude";
    const short = q ? shortTerm(q) : null;
    const candidates = short
      ? await wordCandidates(db, workspaceId, short)
      : q && !q.startsWith("sha256:")
        ? await trigramCandidates(db, workspaceId, q)
        : null;
    if (candidates && candidates.length === 0) return { target: "maps", items: [], nextCursor: null, ...(folding && { constantFolded: 0 }) };
    const c: SQL[] = [eq(maps.workspaceId, workspaceId)];
    if (!includeRetracted) c.push(eq(maps.status, "certified"));
    // One JSON parameter rather than thousands of placeholders: the statement is prepared per request.
    if (candidates) c.push(sql`${maps}.rowid IN (SELECT value FROM json_each(${JSON.stringify(candidates)}))`);
    if (short && !candidates) {
      // A common short term: each list is built once, and the walk in map order stops at the page's end.
      const words = sql`(SELECT rowid FROM models_words WHERE models_words MATCH ${short})`;
      c.push(or(sql`${maps}.rowid IN (SELECT rowid FROM maps_words WHERE maps_words MATCH ${short})`, sql`${source}.rowid IN ${words}`, sql`${target}.rowid IN ${words}`)!);
    } else if (q && !short) {
      c.push(
        q.startsWith("sha256:")
          ? eq(maps.certificateAddress, q)
          : or(likeEscaped(sql`${maps.summary}`, q), likeEscaped(sql`${source.name}`, q), likeEscaped(sql`${target.name}`, q))!,
      );
    }
    if (rule !== undefined) c.push(eq(source.rule, rule));
    if (symmetryClass !== undefined) c.push(eq(source.symmetryClass, symmetryClass));
    if (tag) c.push(hasTag(sql`${source.tags}`, tag));
    if (block !== undefined) c.push(eq(maps.block, block));
    if (mapKind) c.push(eq(maps.kind, mapKind));
    if (modelKind) c.push(eq(source.kind, modelKind));
    const constantFolded = folding ? await countOntoConstant(db, c) : undefined;
    if (folding) c.push(not(ontoConstant()));
    if (constantTargets === "only") c.push(ontoConstant());
    if (cursor) c.push(gt(maps.id, String(decodeCursor(cursor, 1)[0])));
    const rows = await db
      .select({
        map: maps,
        source: { id: source.id, address: source.address, kind: source.kind, name: source.name, rule: source.rule },
        target: { id: target.id, address: target.address, kind: target.kind, name: target.name, rule: target.rule },
        definition: sql<string | null>`coalesce(json_extract(${certificates.body}, '$.map.projection'), json_extract(${certificates.body}, '$.map.partition'))`,
        sourceLabels: sql<string | null>`json_extract(${source.canonical}, '$.labels')`,
      })
      .from(maps)
      .innerJoin(source, eq(source.id, maps.sourceModelId))
      .innerJoin(target, eq(target.id, maps.targetModelId))
      .innerJoin(certificates, eq(certificates.address, maps.certificateAddress))
      .where(and(...c))
      .orderBy(asc(maps.id))
      .limit(limit + 1)
      .all();
    const items = rows.slice(0, limit).map((r) => ({ ...r.map, source: r.source, target: r.target, definition: r.definition, sourceLabels: r.sourceLabels }));
    const last = items[items.length - 1];
    return { target: "maps", items, nextCursor: rows.length > limit && last ? encodeCursor([last.id]) : null, ...(constantFolded !== undefined && { constantFolded }) };
  });
}

const ontoConstant = () => and(eq(target.kind, "eca"), inArray(target.rule, CONSTANT_ECA_RULES))!;

/** How many maps meeting the conditions `c` (over maps, source and target) go onto a constant ECA. */
async function countOntoConstant(db: Executor, c: SQL[]): Promise<number> {
  const [row] = await db
    .select({ n: count() })
    .from(maps)
    .innerJoin(source, eq(source.id, maps.sourceModelId))
    .innerJoin(target, eq(target.id, maps.targetModelId))
    .where(and(...c, ontoConstant()));
  return row?.n ?? 0;
}

/** The hierarchy of one model class: its models grouped by symmetry class, and the maps among them. */
export async function getClassHierarchy({
  db = getDatabase(),
  workspaceId,
  kind,
}: {
  db?: Executor;
  workspaceId: string;
  kind: ModelKind;
}): Promise<{
  groups: { symmetryClass: number | null; models: Model[] }[];
  edges: { id: string; sourceModelId: string; targetModelId: string; kind: MapKind; block: number | null }[];
}> {
  return withDb("reading a hierarchy", async () => {
    const nodes = await db
      .select()
      .from(models)
      .where(and(eq(models.workspaceId, workspaceId), eq(models.kind, kind)))
      .orderBy(asc(models.symmetryClass), asc(models.rule), asc(models.name))
      .all();
    const edges = await db
      .select({
        id: maps.id,
        sourceModelId: maps.sourceModelId,
        targetModelId: maps.targetModelId,
        kind: maps.kind,
        block: maps.block,
      })
      .from(maps)
      .innerJoin(source, eq(source.id, maps.sourceModelId))
      .innerJoin(target, eq(target.id, maps.targetModelId))
      .where(and(eq(maps.workspaceId, workspaceId), eq(maps.status, "certified"), eq(source.kind, kind), eq(target.kind, kind)))
      .all();
    const groups = new Map<number | null, Model[]>();
    for (const m of nodes) groups.set(m.symmetryClass, [...(groups.get(m.symmetryClass) ?? []), m]);
    return { groups: [...groups].map(([symmetryClass, ms]) => ({ symmetryClass, models: ms })), edges };
  });
}

/** Recorded searches of a model, newest first: the evidence behind "none within these bounds". */
export async function listSearchRecords({
  db = getDatabase(),
  workspaceId,
  modelId,
}: {
  db?: Executor;
  workspaceId: string;
  modelId: string;
}): Promise<SearchRecord[]> {
  return withDb("reading search records", () =>
    db
      .select()
      .from(searchRecords)
      .where(and(eq(searchRecords.workspaceId, workspaceId), eq(searchRecords.modelId, modelId)))
      .orderBy(desc(searchRecords.createdAt))
      .all(),
  );
}

/**
 * Records a finished exhaustive search. `outcome.targets` lists the content addresses of every
 * model the search reached, so "does A coarse-grain onto B" can answer "no up to block N".
 */
export async function createSearchRecord({
  db = getDatabase(),
  workspaceId,
  modelId,
  kind,
  maxBlock,
  algorithm,
  algorithmVersion,
  coverage,
  outcome,
  jobId = null,
  userId = null,
}: {
  db?: Executor;
  workspaceId: string;
  modelId: string;
  kind: string;
  maxBlock: number | null;
  algorithm: string;
  algorithmVersion: string;
  coverage: Record<string, unknown>;
  outcome: { targets: string[] } & Record<string, unknown>;
  jobId?: string | null;
  userId?: string | null;
}): Promise<SearchRecord> {
  return withDb("recording a search", async () => {
    const [row] = await db
      .insert(searchRecords)
      .values({
        workspaceId,
        modelId,
        kind,
        maxBlock,
        algorithm,
        algorithmVersion,
        coverage: JSON.stringify(coverage),
        outcome: JSON.stringify(outcome),
        found: outcome.targets.length,
        jobId,
        createdBy: userId,
      })
      .returning();
    return row;
  });
}

export type EcaCongruenceRecord = { rule: number; modelId: string; maxBlock: number | null; coverage: string; outcome: string; createdAt: Date };

/** Every recorded congruence search of an ECA in the workspace: the rows the smallest-block table is read from. */
export async function listEcaCongruenceRecords({ db = getDatabase(), workspaceId }: { db?: Executor; workspaceId: string }): Promise<EcaCongruenceRecord[]> {
  return withDb("reading congruence searches", async () => {
    const rows = await db
      .select({ rule: models.rule, modelId: models.id, maxBlock: searchRecords.maxBlock, coverage: searchRecords.coverage, outcome: searchRecords.outcome, createdAt: searchRecords.createdAt })
      .from(searchRecords)
      .innerJoin(models, eq(models.id, searchRecords.modelId))
      .where(and(eq(searchRecords.workspaceId, workspaceId), eq(searchRecords.kind, "congruences"), eq(models.kind, "eca")))
      .all();
    return rows.filter((r): r is EcaCongruenceRecord => r.rule !== null);
  });
}
