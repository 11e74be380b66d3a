import "server-only";
import { sql } from "drizzle-orm";
import { type Executor, getDatabase, withDb } from "./connection";

export const MAX_PATH_DEPTH = 8;

export type AtlasPath = { mapIds: string[]; modelIds: string[] };

/**
 * All simple paths of certified maps from one model to another with at most `maxDepth` maps,
 * shortest first, as ordered map ids: each is a chain that could be composed and certified as one.
 *
 * A SQLite recursive CTE walks the edges breadth first; a path never revisits a model (the visited
 * list is a comma-delimited string) and stops growing once it reaches the target.
 */
export async function findPaths({
  db = getDatabase(),
  workspaceId,
  from,
  to,
  maxDepth,
  limit = 100,
}: {
  db?: Executor;
  workspaceId: string;
  from: string;
  to: string;
  maxDepth: number;
  limit?: number;
}): Promise<AtlasPath[]> {
  const depth = Math.max(1, Math.min(MAX_PATH_DEPTH, Math.floor(maxDepth)));
  return withDb("finding paths", async () => {
    const rows = await db.all<{ map_ids: string; model_ids: string }>(sql`
      WITH RECURSIVE walk(node, map_ids, model_ids, depth) AS (
        SELECT m.target_model_id, m.id, ',' || m.source_model_id || ',' || m.target_model_id || ',', 1
          FROM maps m
         WHERE m.workspace_id = ${workspaceId} AND m.source_model_id = ${from} AND m.status = 'certified'
           AND m.target_model_id <> ${from}
        UNION ALL
        SELECT m.target_model_id, w.map_ids || ',' || m.id, w.model_ids || m.target_model_id || ',', w.depth + 1
          FROM walk w
          JOIN maps m ON m.workspace_id = ${workspaceId} AND m.source_model_id = w.node AND m.status = 'certified'
         WHERE w.depth < ${depth} AND w.node <> ${to}
           AND instr(w.model_ids, ',' || m.target_model_id || ',') = 0
      )
      SELECT map_ids, model_ids FROM walk WHERE node = ${to} ORDER BY depth, map_ids LIMIT ${limit}
    `);
    return rows.map((r) => ({
      mapIds: r.map_ids.split(","),
      modelIds: r.model_ids.split(",").filter((s) => s.length > 0),
    }));
  });
}
