import "server-only";
import { and, asc, eq, gt, or } from "drizzle-orm";
import { models, type Model, type MODEL_KINDS } from "@/db/schema";
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
    const column = idOrAddress.startsWith("sha256:") ? models.address : models.id;
    const row = await db
      .select()
      .from(models)
      .where(and(eq(models.workspaceId, workspaceId), eq(column, idOrAddress)))
      .get();
    return row ?? null;
  });
}

/** Models of a workspace in a stable order (name, then id), one page after `cursor`. */
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
    if (cursor) {
      const [name, id] = decodeCursor(cursor, 2).map(String);
      const after = or(gt(models.name, name), and(eq(models.name, name), gt(models.id, id)));
      if (after) conditions.push(after);
    }
    const rows = await db
      .select()
      .from(models)
      .where(and(...conditions))
      .orderBy(asc(models.name), asc(models.id))
      .limit(limit + 1)
      .all();
    const items = rows.slice(0, limit);
    const last = items[items.length - 1];
    return { items, nextCursor: rows.length > limit && last ? encodeCursor([last.name, last.id]) : null };
  });
}
