import "server-only";
import { and, eq } from "drizzle-orm";
import { models, type Model } from "@/db/schema";
import { getDatabase, withDb, type Executor } from "./connection";

/**
 * Gives a stored model its maker's name (and description) when it still carries the generic name the
 * server gave it, e.g. because a job stored it first; a name someone chose is never overwritten.
 */
export async function nameModelIfGeneric({
  db = getDatabase(),
  workspaceId,
  modelId,
  genericName,
  name,
  description,
}: {
  db?: Executor;
  workspaceId: string;
  modelId: string;
  genericName: string;
  name: string;
  description?: string;
}): Promise<Model | null> {
  return withDb("naming a model", async () => {
    const [row] = await db
      .update(models)
      .set({ name, ...(description ? { description } : {}) })
      .where(and(eq(models.id, modelId), eq(models.workspaceId, workspaceId), eq(models.name, genericName)))
      .returning();
    return row ?? null;
  });
}
