import { createHash } from "node:crypto";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createCertifiedEdge, setDatabase, type CertifiedEdgeInput } from "@/db/queries/atlas";
import { listCertificateChecks, listModelMaps, recordCertificateCheck } from "@/db/queries/maps";
import { models, notificationOutbox } from "@/db/schema";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { ecaFields, seedAtlasPeople, watchModel } from "./atlas-fixtures";

let t: TestDatabase;
let ws: string;
let userId: string;
let viewerId: string;
const ids: Record<number, string> = {};

/** A stored edge whose certificate body carries a projection, with the ECAs' symmetry classes set. */
function edge(from: number, to: number, block: number, projection: number[]): CertifiedEdgeInput {
  const body = JSON.stringify({ map: { kind: "projection", block, projection }, source: { kind: "eca", rule: from }, target: { kind: "eca", rule: to } });
  // Symmetry classes written out (the smallest rule under reflection and 0↔1 exchange): 0 ~ 255, 90 ~ 165, 15 ~ 85.
  const cls: Record<number, number> = { 0: 0, 255: 0, 90: 90, 15: 15, 30: 30 };
  return {
    workspaceId: ws,
    userId,
    certificate: { address: `sha256:${createHash("sha256").update(body).digest("hex")}`, kind: "projection", formatVersion: 1, body, checkerVersion: "test", verifiedAt: new Date() },
    source: { ...ecaFields(from), symmetryClass: cls[from] ?? null },
    target: { ...ecaFields(to), symmetryClass: cls[to] ?? null },
    map: { kind: "projection", block, steps: block, summary: `ECA ${from} → ECA ${to}` },
  };
}

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  const seeded = await seedAtlasPeople(t.db, "maps-lab");
  ws = seeded.workspace.id;
  userId = seeded.people.curator.id;
  viewerId = seeded.people.viewer.id;
  await createCertifiedEdge(edge(30, 0, 2, [0, 0, 0, 0]));
  await createCertifiedEdge(edge(30, 255, 2, [1, 1, 1, 1]));
  await createCertifiedEdge(edge(30, 90, 2, [0, 1, 1, 0]));
  await createCertifiedEdge(edge(30, 15, 3, [0, 0, 0, 0, 1, 1, 1, 1]));
  for (let rule = 1; rule <= 45; rule++) if (rule !== 30) await createCertifiedEdge(edge(rule, 0, 2, [0, 0, 0, rule % 2]));
  for (const m of await t.db.select().from(models).all()) if (m.rule !== null) ids[m.rule] = m.id;
});
afterAll(() => t.cleanup());

describe("listModelMaps", () => {
  it("pages through ECA 0's incoming maps 20 at a time, by the source's rule number, none twice", async () => {
    const seen: number[] = [];
    const sizes: number[] = [];
    let cursor: string | null = null;
    do {
      const page: Awaited<ReturnType<typeof listModelMaps>> = await listModelMaps({ workspaceId: ws, modelId: ids[0], direction: "to", limit: 20, cursor });
      expect(page.total).toBe(45);
      sizes.push(page.items.length);
      seen.push(...page.items.map((m) => m.source.rule!));
      cursor = page.nextCursor;
    } while (cursor);
    expect(sizes).toEqual([20, 20, 5]);
    expect(seen).toEqual(Array.from({ length: 45 }, (_, i) => i + 1));
  });

  it("folds the maps onto the constant rules 0 and 255 into a count", async () => {
    const all = await listModelMaps({ workspaceId: ws, modelId: ids[30], direction: "from" });
    expect(all.items.map((m) => m.target.rule)).toEqual([0, 15, 90, 255]);
    const folded = await listModelMaps({ workspaceId: ws, modelId: ids[30], direction: "from", hideConstant: true });
    expect(folded.items.map((m) => m.target.rule)).toEqual([15, 90]);
    expect(folded.constant).toBe(2);
    expect(folded.total).toBe(4);
  });

  it("filters by block size, kind and the target's symmetry class", async () => {
    const block3 = await listModelMaps({ workspaceId: ws, modelId: ids[30], direction: "from", block: 3 });
    expect(block3.items.map((m) => m.target.rule)).toEqual([15]);
    const class0 = await listModelMaps({ workspaceId: ws, modelId: ids[30], direction: "from", otherClass: 0 });
    expect(class0.items.map((m) => m.target.rule)).toEqual([0, 255]);
    const lumpings = await listModelMaps({ workspaceId: ws, modelId: ids[30], direction: "from", kind: "lumping" });
    expect(lumpings.items).toEqual([]);
  });

  it("carries each map's projection from its certificate", async () => {
    const block3 = await listModelMaps({ workspaceId: ws, modelId: ids[30], direction: "from", otherClass: 90 });
    expect(JSON.parse(block3.items[0].definition!)).toEqual([0, 1, 1, 0]);
  });
});

describe("certificate re-verification records", () => {
  it("lists each recorded re-verification with its result, newest first", async () => {
    const [map] = (await listModelMaps({ workspaceId: ws, modelId: ids[30], direction: "from", otherClass: 90 })).items;
    expect(await listCertificateChecks({ workspaceId: ws, mapId: map.id })).toEqual([]);
    await recordCertificateCheck({ workspaceId: ws, mapId: map.id, userId, status: "holds", checkerVersion: "squarely-checker/1" });
    await new Promise((r) => setTimeout(r, 5));
    await recordCertificateCheck({ workspaceId: ws, mapId: map.id, userId, status: "too-large", checkerVersion: null });
    const checks = await listCertificateChecks({ workspaceId: ws, mapId: map.id });
    expect(checks.map((c) => c.status)).toEqual(["too-large", "holds"]);
    expect(checks[1]).toMatchObject({ actorId: userId, checkerVersion: "squarely-checker/1" });
    expect(checks[0].at.getTime()).toBeGreaterThanOrEqual(checks[1].at.getTime());
  });
});

describe("a watcher's mail about a new map", () => {
  it("says who certified it and what the map is, so two maps between the same models read apart", async () => {
    await watchModel(t.db, ws, viewerId, ids[30]);
    await createCertifiedEdge(edge(30, 60, 2, [0, 0, 1, 1]));
    const mail = await t.db.select().from(notificationOutbox).where(eq(notificationOutbox.userId, viewerId)).all();
    expect(mail).toHaveLength(1);
    expect(mail[0].body).toContain("Projection (coarse symbol of each block state, 0…0 first): 0011");
    expect(mail[0].body).toContain("By: The curator");
  });
});
