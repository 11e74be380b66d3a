import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Graph, alg } from "@dagrejs/graphlib";
import { createCertifiedEdge, findPaths, getModel, retractMap, setDatabase } from "@/db/queries/atlas";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { ecaFields, edgeInput, seedAtlasPeople } from "./atlas-fixtures";

/** mulberry32, a small seeded generator (common practice), so each graph is reproducible. */
function random(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Every simple path of at most `maxDepth` edges, enumerated on graphlib's own adjacency. */
function referencePaths(g: Graph, from: string, to: string, maxDepth: number): string[] {
  const out: string[] = [];
  const walk = (node: string, visited: Set<string>, edges: string[]) => {
    if (node === to && edges.length > 0) {
      out.push(edges.join(","));
      return;
    }
    if (edges.length === maxDepth) return;
    for (const e of g.outEdges(node) ?? []) {
      if (visited.has(e.w)) continue;
      walk(e.w, new Set([...visited, e.w]), [...edges, e.name!]);
    }
  };
  walk(from, new Set([from]), []);
  return out.sort();
}

let t: TestDatabase;
beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
});
afterAll(() => {
  setDatabase(null);
  t.cleanup();
});

describe("findPaths agrees with @dagrejs/graphlib on random graphs", () => {
  for (const seed of [7, 2024, 99]) {
    it(`seed ${seed}: same simple paths up to depth 3, shortest first, retracted maps left out`, async () => {
      const { workspace, people } = await seedAtlasPeople(t.db, `paths-${seed}`);
      const next = random(seed);
      const nodes = 12;
      const g = new Graph({ directed: true, multigraph: true });
      for (let v = 0; v < nodes; v++) g.setNode(String(v));
      for (let e = 0; e < 30; e++) {
        const v = Math.floor(next() * nodes);
        const w = Math.floor(next() * nodes);
        if (v === w) continue;
        // Two maps between one pair (different block sizes) are two different edges.
        const made = await createCertifiedEdge(edgeInput(workspace.id, people.contributor.id, v, w, 2 + (e % 2)));
        if (made.status !== "created") continue;
        if (next() < 0.15) {
          await retractMap({ workspaceId: workspace.id, mapId: made.mapId, userId: people.curator.id, reason: "test" });
        } else {
          g.setEdge(String(v), String(w), undefined, made.mapId);
        }
      }
      const ids = new Map<string, string>();
      for (let v = 0; v < nodes; v++) {
        const row = await getModel({ workspaceId: workspace.id, idOrAddress: ecaFields(v).address });
        if (row) ids.set(String(v), row.id);
      }
      let compared = 0;
      let withPaths = 0;
      for (const a of ids.keys()) {
        const distances = alg.dijkstra(g, a);
        for (const b of ids.keys()) {
          if (a === b) continue;
          const found = await findPaths({ workspaceId: workspace.id, from: ids.get(a)!, to: ids.get(b)!, maxDepth: 3, limit: 10_000 });
          expect(found.map((p) => p.mapIds.join(",")).sort()).toEqual(referencePaths(g, a, b, 3));
          const d = distances[b].distance;
          if (d <= 3) expect(found[0].mapIds).toHaveLength(d);
          else expect(found).toEqual([]);
          for (const p of found) expect(p.modelIds).toHaveLength(p.mapIds.length + 1);
          compared++;
          if (found.length > 1) withPaths++;
        }
      }
      expect(compared).toBeGreaterThan(50);
      expect(withPaths).toBeGreaterThan(5);
    });
  }
});
