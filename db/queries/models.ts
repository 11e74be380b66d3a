import "server-only";
import { and, asc, eq, sql } from "drizzle-orm";
import { models, type Model, type MODEL_KINDS } from "@/db/schema";
import { recordAuditEvent } from "./audit";
import { type Executor, getDatabase, withDb } from "./connection";
import { decodeCursor, encodeCursor } from "./cursor";

export type ModelKind = (typeof MODEL_KINDS)[number];

/** The columns of a model as the server derives them from the core's canonical form. */
export type ModelFields = {
  address: string;
  kind: ModelKind;
  name: string;
  canonical: string;
  description?: string;
  rule?: number | null;
  alphabet?: number | null;
  radius?: number | null;
  states?: number | null;
  block?: number | null;
  steps?: number | null;
  symmetryClass?: number | null;
  /** The model a derived one (supercell, decimated chain, iterate) is built on; stored first. */
  base?: ModelFields | null;
  tags?: string[];
};

/**
 * Stores a model once per workspace: a second call with the same content address returns the
 * existing row unchanged (the address is of the canonical form, so spelling does not matter).
 */
export async function upsertModel({
  db = getDatabase(),
  workspaceId,
  model,
  userId = null,
}: {
  db?: Executor;
  workspaceId: string;
  model: ModelFields;
  userId?: string | null;
}): Promise<{ model: Model; created: boolean }> {
  return withDb("storing a model", async () => {
    const baseModelId = model.base ? (await upsertModel({ db, workspaceId, model: model.base, userId })).model.id : null;
    const inserted = await db
      .insert(models)
      .values({
        workspaceId,
        address: model.address,
        kind: model.kind,
        name: model.name,
        canonical: model.canonical,
        description: model.description ?? "",
        rule: model.rule ?? null,
        alphabet: model.alphabet ?? null,
        radius: model.radius ?? null,
        states: model.states ?? null,
        block: model.block ?? null,
        steps: model.steps ?? null,
        symmetryClass: model.symmetryClass ?? null,
        baseModelId,
        tags: JSON.stringify(model.tags ?? []),
        createdBy: userId,
      })
      .onConflictDoNothing({ target: [models.workspaceId, models.address] })
      .returning();
    if (inserted[0]) return { model: inserted[0], created: true };
    const existing = await db
      .select()
      .from(models)
      .where(and(eq(models.workspaceId, workspaceId), eq(models.address, model.address)))
      .get();
    if (!existing) throw new Error(`model ${model.address} vanished between insert and select`);
    return { model: existing, created: false };
  });
}

/** A model by its id or by its `sha256:` address, within one workspace. */
export async function getModel({
  db = getDatabase(),
  workspaceId,
  idOrAddress,
}: {
  db?: Executor;
  workspaceId: string;
  idOrAddress: string;
}): Promise<Model | null> {
  return withDb("reading a model", async () => {
    const byAddress = idOrAddress.startsWith("sha256:");
    const row = await modelLookups(db)[byAddress ? "address" : "id"].get({ workspaceId, key: idOrAddress });
    return row ?? null;
  });
}

// Read on every model page and API call, and twice per path search: prepared once per database.
const modelLookupsByDb = new WeakMap<object, Record<"id" | "address", ReturnType<typeof prepareModelLookup>>>();

function prepareModelLookup(db: Executor, by: "id" | "address") {
  return db
    .select()
    .from(models)
    .where(and(eq(models.workspaceId, sql.placeholder("workspaceId")), eq(models[by], sql.placeholder("key"))))
    .prepare();
}

function modelLookups(db: Executor) {
  let prepared = modelLookupsByDb.get(db);
  if (!prepared) modelLookupsByDb.set(db, (prepared = { id: prepareModelLookup(db, "id"), address: prepareModelLookup(db, "address") }));
  return prepared;
}

/**
 * The order every model list uses: models with a rule number (ECAs) first, by rule number (so
 * ECA 2 comes before ECA 10), then the rest by name, then id. Its cursor is these four values.
 */
export const modelOrder = [sql`(${models.rule} IS NULL)`, sql`coalesce(${models.rule}, -1)`, asc(models.name), asc(models.id)] as const;

export function modelCursor(m: Pick<Model, "rule" | "name" | "id">): string {
  return encodeCursor([m.rule === null ? 1 : 0, m.rule ?? -1, m.name, m.id]);
}

/** The rows after a `modelCursor` in `modelOrder`. */
export function afterModelCursor(cursor: string) {
  const [noRule, rule, name, id] = decodeCursor(cursor, 4);
  return sql`((${models.rule} IS NULL), coalesce(${models.rule}, -1), ${models.name}, ${models.id}) > (${Number(noRule)}, ${Number(rule)}, ${String(name)}, ${String(id)})`;
}

/** Models of a workspace in `modelOrder`, one page after `cursor`. */
export async function listModels({
  db = getDatabase(),
  workspaceId,
  kind,
  limit = 50,
  cursor,
}: {
  db?: Executor;
  workspaceId: string;
  kind?: ModelKind;
  limit?: number;
  cursor?: string | null;
}): Promise<{ items: Model[]; nextCursor: string | null }> {
  return withDb("listing models", async () => {
    const conditions = [eq(models.workspaceId, workspaceId)];
    if (kind) conditions.push(eq(models.kind, kind));
    if (cursor) conditions.push(afterModelCursor(cursor));
    const rows = await db
      .select()
      .from(models)
      .where(and(...conditions))
      .orderBy(...modelOrder)
      .limit(limit + 1)
      .all();
    const items = rows.slice(0, limit);
    const last = items[items.length - 1];
    return { items, nextCursor: rows.length > limit && last ? modelCursor(last) : null };
  });
}

/**
 * A person's display name and short description for a model in one workspace (the content address
 * and canonical form never change). Audited; null when the model is not in the workspace.
 */
export async function updateModelDetails({
  db = getDatabase(),
  workspaceId,
  modelId,
  userId,
  name,
  description,
}: {
  db?: ReturnType<typeof getDatabase>;
  workspaceId: string;
  modelId: string;
  userId: string | null;
  name: string;
  description: string;
}): Promise<Model | null> {
  return withDb("renaming a model", () =>
    db.transaction(async (tx) => {
      const before = await tx
        .select({ name: models.name, description: models.description })
        .from(models)
        .where(and(eq(models.workspaceId, workspaceId), eq(models.id, modelId)))
        .get();
      if (!before) return null;
      const [row] = await tx
        .update(models)
        .set({ name, description })
        .where(and(eq(models.workspaceId, workspaceId), eq(models.id, modelId)))
        .returning();
      await recordAuditEvent({ db: tx, workspaceId, actorId: userId, action: "model:rename", subjectType: "model", subjectId: modelId, detail: { before, after: { name, description } } });
      return row ?? null;
    }),
  );
}
