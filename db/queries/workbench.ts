import "server-only";
import type { Model } from "@/db/schema";
import { createChain } from "./chains";
import { getDatabase, wrapDbError } from "./connection";
import { createCertifiedEdge, type CertifiedEdgeInput } from "./maps";
import { nameModelIfGeneric } from "./model-names";
import { upsertModel, type ModelFields } from "./models";

/** A model to store, and the name its maker gave it (kept only over the generic name). */
export type WorkbenchModelWrite = { key: string; fields: ModelFields; genericName: string; name?: string; description?: string };
/** A verified map; `targetName` is the maker's name for the model the map determines. */
export type WorkbenchEdgeWrite = { key: string; edge: Omit<CertifiedEdgeInput, "db" | "workspaceId" | "userId">; targetName?: string };
/** The chain's links: a key of a map written here, or the id of a map already in the atlas. */
export type WorkbenchChainWrite = {
  name: string;
  links: ({ key: string } | { mapId: string })[];
  composite: Parameters<typeof createChain>[0]["composite"];
  verification: "links" | "links+composite";
};

export type WorkbenchWritten = {
  models: Record<string, Model>;
  edges: Record<string, { status: "created" | "existing"; mapId: string; address: string; target: Model }>;
  chain: { status: "created" | "existing"; chainId: string; address: string } | null;
};

/**
 * Writes what the workbench certified in one transaction: the models made on the canvas (with their
 * makers' names), every verified map (certificate, models, map, audit, watchers' mail), and the chain
 * with its verified composite. A failure anywhere writes nothing.
 */
export async function storeWorkbench({
  workspaceId,
  userId,
  models,
  edges,
  chain,
}: {
  workspaceId: string;
  userId: string;
  models: WorkbenchModelWrite[];
  edges: WorkbenchEdgeWrite[];
  chain: WorkbenchChainWrite | null;
}): Promise<WorkbenchWritten> {
  const db = getDatabase();
  try {
    return await db.transaction(async (tx) => {
      const named = async (model: Model, genericName: string, name?: string, description?: string) =>
        name && model.name !== name ? ((await nameModelIfGeneric({ db: tx, workspaceId, modelId: model.id, genericName, name, description })) ?? model) : model;
      const written: WorkbenchWritten = { models: {}, edges: {}, chain: null };
      for (const m of models) {
        const fields = { ...m.fields, name: m.name || m.fields.name, description: m.description ?? m.fields.description };
        const stored = await upsertModel({ db: tx, workspaceId, model: fields, userId });
        written.models[m.key] = stored.created ? stored.model : await named(stored.model, m.genericName, m.name, m.description);
      }
      for (const e of edges) {
        // A savepoint inside this transaction (drizzle nests transactions so).
        const stored = await createCertifiedEdge({ ...e.edge, db: tx as unknown as ReturnType<typeof getDatabase>, workspaceId, userId });
        const target = (await upsertModel({ db: tx, workspaceId, model: e.edge.target, userId })).model;
        written.edges[e.key] = { ...stored, target: await named(target, e.edge.target.name, e.targetName) };
      }
      if (chain) {
        const mapIds = chain.links.map((l) => ("key" in l ? written.edges[l.key].mapId : l.mapId));
        written.chain = await createChain({
          db: tx as unknown as ReturnType<typeof getDatabase>,
          workspaceId,
          userId,
          name: chain.name,
          mapIds,
          composite: chain.composite,
          verification: chain.verification,
        });
      }
      return written;
    });
  } catch (err) {
    throw wrapDbError(err, "storing the workbench");
  }
}
