import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq, sql } from "drizzle-orm";
import {
  EDGE_WRITE_STEPS,
  createCertifiedEdge,
  getMap,
  listMapsFrom,
  listMapsTo,
  retractMap,
  searchAtlas,
  setDatabase,
} from "@/db/queries/atlas";
import { auditEvents, certificates, maps, models, notificationOutbox } from "@/db/schema";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { edgeInput, seedAtlasPeople, watchModel } from "./atlas-fixtures";

let t: TestDatabase;
let ws: string;
let people: Awaited<ReturnType<typeof seedAtlasPeople>>["people"];

async function counts() {
  const n = async (table: typeof maps | typeof models | typeof certificates | typeof auditEvents | typeof notificationOutbox) =>
    (await t.db.select({ n: sql<number>`count(*)` }).from(table).get())!.n;
  return {
    certificates: await n(certificates),
    models: await n(models),
    maps: await n(maps),
    audit: await n(auditEvents),
    outbox: await n(notificationOutbox),
  };
}

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  const seeded = await seedAtlasPeople(t.db);
  ws = seeded.workspace.id;
  people = seeded.people;
});
afterAll(() => {
  setDatabase(null);
  t.cleanup();
});

describe("createCertifiedEdge", () => {
  it("writes certificate, both models, the map and an audit event, and the same certificate again is the same map", async () => {
    const before = await counts();
    const first = await createCertifiedEdge(edgeInput(ws, people.contributor.id, 146, 128));
    expect(first.status).toBe("created");
    const after = await counts();
    expect(after).toMatchObject({
      certificates: before.certificates + 1,
      models: before.models + 2,
      maps: before.maps + 1,
      audit: before.audit + 1,
    });
    const second = await createCertifiedEdge(edgeInput(ws, people.curator.id, 146, 128));
    expect(second).toEqual({ ...first, status: "existing" });
    expect(await counts()).toEqual(after);
  });

  it("two submissions of one certificate at the same moment leave one map", async () => {
    const results = await Promise.all([0, 1, 2].map(() => createCertifiedEdge(edgeInput(ws, people.contributor.id, 18, 90, 3))));
    expect(new Set(results.map((r) => r.mapId)).size).toBe(1);
    expect(results.filter((r) => r.status === "created")).toHaveLength(1);
  });

  it("queues one message per watcher of either model, never to the author", async () => {
    const made = await createCertifiedEdge(edgeInput(ws, people.contributor.id, 105, 150));
    const map = (await getMap({ workspaceId: ws, mapId: made.mapId }))!;
    await watchModel(t.db, ws, people.viewer.id, map.source.id);
    await watchModel(t.db, ws, people.viewer.id, map.target.id);
    await watchModel(t.db, ws, people.admin.id, map.target.id);
    await watchModel(t.db, ws, people.contributor.id, map.target.id);
    const next = await createCertifiedEdge(edgeInput(ws, people.contributor.id, 105, 150, 4));
    const mail = await t.db.select().from(notificationOutbox).where(eq(notificationOutbox.mapId, next.mapId)).all();
    expect(mail.map((m) => m.toAddress).sort()).toEqual([people.admin.email, people.viewer.email].sort());
    expect(mail.every((m) => m.status === "pending" && m.subject.includes("ECA 105"))).toBe(true);
  });

  for (const step of EDGE_WRITE_STEPS) {
    it(`a failure injected after the ${step} step leaves no partial rows`, async () => {
      const made = await createCertifiedEdge(edgeInput(ws, people.contributor.id, 30, 1, 2));
      const map = (await getMap({ workspaceId: ws, mapId: made.mapId }))!;
      await watchModel(t.db, ws, people.admin.id, map.source.id).catch(() => undefined);
      const before = await counts();
      const input = edgeInput(ws, people.contributor.id, 30, 777 + EDGE_WRITE_STEPS.indexOf(step), 3);
      await expect(
        createCertifiedEdge({
          ...input,
          onStep: (s) => {
            if (s === step) throw new Error(`injected failure after ${s}`);
          },
        }),
      ).rejects.toMatchObject({ code: "database" });
      expect(await counts()).toEqual(before);
      expect(await t.db.select().from(certificates).where(eq(certificates.address, input.certificate.address)).get()).toBeUndefined();
    });
  }
});

describe("reading and retracting maps", () => {
  it("lists what a model coarse-grains to and from, a page at a time", async () => {
    for (const to of [2, 3, 4, 5, 6]) await createCertifiedEdge(edgeInput(ws, people.contributor.id, 200, to));
    const from200 = (await searchAtlas({ workspaceId: ws, target: "models", rule: 200 })).items[0];
    const page1 = await listMapsFrom({ workspaceId: ws, modelId: from200.id, limit: 3 });
    expect(page1.items).toHaveLength(3);
    expect(page1.nextCursor).not.toBeNull();
    const page2 = await listMapsFrom({ workspaceId: ws, modelId: from200.id, limit: 3, cursor: page1.nextCursor });
    expect(page2.items).toHaveLength(2);
    expect(page2.nextCursor).toBeNull();
    const targets = [...page1.items, ...page2.items].map((m) => m.target.rule).sort((a, b) => a! - b!);
    expect(targets).toEqual([2, 3, 4, 5, 6]);
    const onto4 = await listMapsTo({ workspaceId: ws, modelId: [...page1.items, ...page2.items].find((m) => m.target.rule === 4)!.target.id });
    expect(onto4.items.map((m) => m.source.rule)).toEqual([200]);
  });

  it("a bad cursor is a 400 naming the cursor field", async () => {
    await expect(listMapsFrom({ workspaceId: ws, modelId: "x", cursor: "not-a-cursor" })).rejects.toMatchObject({
      code: "bad_input",
      field: "cursor",
    });
  });

  it("a curator's retraction keeps the map, records the reason, hides it from listings, and cannot happen twice", async () => {
    const made = await createCertifiedEdge(edgeInput(ws, people.contributor.id, 60, 102));
    const retracted = await retractMap({ workspaceId: ws, mapId: made.mapId, userId: people.curator.id, reason: "wrong block" });
    expect(retracted).toMatchObject({ status: "retracted", retractedReason: "wrong block", retractedBy: people.curator.id });
    const listed = await listMapsFrom({ workspaceId: ws, modelId: retracted.source.id });
    expect(listed.items.map((m) => m.id)).not.toContain(made.mapId);
    const all = await listMapsFrom({ workspaceId: ws, modelId: retracted.source.id, includeRetracted: true });
    expect(all.items.map((m) => m.id)).toContain(made.mapId);
    await expect(
      retractMap({ workspaceId: ws, mapId: made.mapId, userId: people.curator.id, reason: "again" }),
    ).rejects.toMatchObject({ code: "conflict" });
    await expect(retractMap({ workspaceId: ws, mapId: "nope", userId: people.curator.id, reason: "x" })).rejects.toMatchObject({
      code: "not_found",
    });
  });

  it("searches by name, rule, block size and map kind", async () => {
    const byName = await searchAtlas({ workspaceId: ws, target: "models", q: "ECA 14" });
    expect(byName.items.map((m) => (m as { name: string }).name)).toContain("ECA 146");
    const byBlock = await searchAtlas({ workspaceId: ws, target: "maps", block: 4 });
    expect(byBlock.items.length).toBeGreaterThan(0);
    expect(byBlock.items.every((m) => (m as { block: number }).block === 4)).toBe(true);
    const byRule = await searchAtlas({ workspaceId: ws, target: "maps", rule: 200, mapKind: "coarse-graining" });
    expect(byRule.items).toHaveLength(5);
    const percent = await searchAtlas({ workspaceId: ws, target: "models", q: "%" });
    expect(percent.items).toHaveLength(0);
  });

  it("folds the maps onto the constant rules (ECA 0, ECA 255) out of a maps list and counts them, or lists only them", async () => {
    const made = new Map<number, string>();
    for (const to of [0, 51, 255, 204]) made.set(to, (await createCertifiedEdge(edgeInput(ws, people.contributor.id, 77, to, 3))).mapId);
    const all = await searchAtlas({ workspaceId: ws, target: "maps", rule: 77 });
    expect(all.items.map((m) => m.id).sort()).toEqual([...made.values()].sort());
    expect("constantFolded" in all).toBe(false);
    const folded = await searchAtlas({ workspaceId: ws, target: "maps", rule: 77, constantTargets: "exclude" });
    expect(folded.items.map((m) => m.id).sort()).toEqual([made.get(51), made.get(204)].sort());
    expect(folded.target === "maps" && folded.constantFolded).toBe(2);
    const only = await searchAtlas({ workspaceId: ws, target: "maps", rule: 77, constantTargets: "only" });
    expect(only.items.map((m) => m.id).sort()).toEqual([made.get(0), made.get(255)].sort());
    // The count follows the other filters: a text that matches none of rule 77's maps counts none.
    const none = await searchAtlas({ workspaceId: ws, target: "maps", rule: 77, q: "no such summary", constantTargets: "exclude" });
    expect(none.target === "maps" && none.constantFolded).toBe(0);
  });

  it("lists each map with its projection as the certificate states it, so the list can show what the map is", async () => {
    const input = edgeInput(ws, people.contributor.id, 150, 105);
    const body = JSON.stringify({ map: { block: 2, projection: [0, 1, 1, 0] } });
    const made = await createCertifiedEdge({ ...input, certificate: { ...input.certificate, body } });
    const listed = await searchAtlas({ workspaceId: ws, target: "maps", rule: 150 });
    const item = listed.items.find((m) => m.id === made.mapId) as { definition: string | null; sourceLabels: string | null } | undefined;
    expect(item && JSON.parse(item.definition!)).toEqual([0, 1, 1, 0]);
    expect(item?.sourceLabels).toBeNull(); // an ECA has no state labels
  });

  it("lists a lumping with its partition and the source chain's state labels", async () => {
    const labels = ["dry", "damp", "wet"];
    const canonical = JSON.stringify({ kind: "markov", labels, matrix: [["1/2", "1/4", "1/4"], ["1/3", "1/3", "1/3"], ["1/3", "1/3", "1/3"]] });
    const lumped = JSON.stringify({ kind: "markov", labels: ["{dry}", "{damp, wet}"], matrix: [["1/2", "1/2"], ["1/3", "2/3"]] });
    const input = edgeInput(ws, people.contributor.id, 11, 12);
    const made = await createCertifiedEdge({
      ...input,
      certificate: { ...input.certificate, kind: "lumping", body: JSON.stringify({ map: { partition: [0, 1, 1] } }) },
      source: { address: "sha256:listed-chain", kind: "markov", name: "Listed chain", canonical, states: 3 },
      target: { address: "sha256:listed-lumped", kind: "markov", name: "Listed chain lumped", canonical: lumped, states: 2 },
      map: { kind: "lumping", block: null, steps: 1, summary: "Listed chain lumped" },
    });
    const listed = await searchAtlas({ workspaceId: ws, target: "maps", mapKind: "lumping", q: "Listed chain" });
    const item = listed.items.find((m) => m.id === made.mapId) as { definition: string | null; sourceLabels: string | null } | undefined;
    expect(item && JSON.parse(item.definition!)).toEqual([0, 1, 1]);
    expect(item && JSON.parse(item.sourceLabels!)).toEqual(labels);
  });
});
