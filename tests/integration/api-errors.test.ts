import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sql } from "drizzle-orm";
import * as certificates from "@/app/api/certificates/route";
import * as retract from "@/app/api/maps/[id]/retract/route";
import * as modelMaps from "@/app/api/models/[id]/maps/route";
import * as paths from "@/app/api/paths/route";
import * as ask from "@/app/api/ask/route";
import { setSessionReader } from "@/app/api/_lib/actor";
import { createSearchRecord, setDatabase } from "@/db/queries/atlas";
import { certificates as certificateRows, maps, models } from "@/db/schema";
import { certifyLumping } from "@/lib/certificate";
import { closeVerificationPool } from "@/server/atlas/pool";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { seedAtlasPeople } from "./atlas-fixtures";
import { call, tokenFor } from "./api-support";

// Land of Oz chain: Grinstead & Snell, Introduction to Probability, Example 11.1.
const OZ = { kind: "markov", labels: ["R", "N", "S"], matrix: [["1/2", "1/4", "1/4"], ["1/2", "0", "1/2"], ["1/4", "1/4", "1/2"]] };

let t: TestDatabase;
let contributor: string;
let curator: string;
let ws: string;

async function counts() {
  const n = async (table: typeof maps | typeof models | typeof certificateRows) =>
    (await t.db.select({ n: sql<number>`count(*)` }).from(table).get())!.n;
  return [await n(certificateRows), await n(models), await n(maps)];
}

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  setSessionReader(async () => null);
  const seeded = await seedAtlasPeople(t.db);
  ws = seeded.workspace.id;
  contributor = await tokenFor(seeded.people.contributor.id, ws, "contributor");
  curator = await tokenFor(seeded.people.curator.id, ws, "curator");
});
afterAll(async () => {
  setSessionReader(null);
  await closeVerificationPool();
  setDatabase(null);
  t.cleanup();
});

const submit = (body: unknown, token = contributor) => call(certificates.POST, { path: "/api/certificates", method: "POST", body, token });

describe("the API's answers from the one error table", () => {
  it("a script submits a lumping (201), submits it again (200, same map) and reads it back from the model", async () => {
    const built = certifyLumping({ chain: OZ, partition: [0, 1, 0] });
    if (!built.ok) throw new Error("unreachable");
    const first = await submit({ certificate: built.certificate });
    expect(first.status).toBe(201);
    const before = await counts();
    const second = await submit({ certificate: built.certificate });
    expect(second).toEqual({ status: 200, json: { ...first.json, status: "existing" } });
    expect(await counts()).toEqual(before);
    const oz = (await t.db.select().from(models).all()).find((m) => m.states === 3)!;
    const read = await call(modelMaps.GET, { path: `/api/models/${oz.address}/maps?direction=from`, params: { id: oz.address }, token: contributor });
    expect(read.status).toBe(200);
    expect((read.json.items as { id: string; kind: string }[]).map((m) => [m.id, m.kind])).toEqual([[first.json.mapId, "lumping"]]);
  });

  it("a partition that is not a lumping answers 422 with the counterexample and writes nothing", async () => {
    const before = await counts();
    const res = await submit({ build: { kind: "lumping", chain: OZ, partition: [0, 0, 1] } });
    expect(res.status).toBe(422);
    expect(res.json).toMatchObject({
      error: { code: "does_not_commute", details: { counterexample: { kind: "not-lumpable", sums: expect.any(Array) } } },
    });
    expect(await counts()).toEqual(before);
  });

  it("bad JSON, a bad field and an unknown kind are 400s that name the field", async () => {
    const badJson = await submit("{not json");
    expect(badJson).toMatchObject({ status: 400, json: { error: { code: "bad_input", field: "body" } } });
    const badField = await submit({ build: { kind: "lumping", chain: OZ, partition: "zero" } });
    expect(badField).toMatchObject({ status: 400, json: { error: { field: expect.stringContaining("partition") } } });
    const badQuery = await call(paths.GET, { path: "/api/paths?from=a&to=b&maxDepth=99", token: contributor });
    expect(badQuery).toMatchObject({ status: 400, json: { error: { field: "maxDepth" } } });
    const badMatrix = await submit({ build: { kind: "lumping", chain: { kind: "markov", matrix: [["1/2", "1/3"], ["1", "0"]] }, partition: [0, 1] } });
    expect(badMatrix.status).toBe(400);
    expect((badMatrix.json.error as { message: string }).message).toMatch(/./);
  });

  it("a body over the limit is 413 before anything is parsed", async () => {
    const res = await submit({ certificate: { format: "x", padding: "0".repeat(2 * 1024 * 1024 + 10) } });
    expect(res).toMatchObject({ status: 413, json: { error: { code: "too_large", field: "body" } } });
  });

  it("an unknown map is 404; retracting twice is 409; a retraction without a reason is 400", async () => {
    const built = certifyLumping({ chain: OZ, partition: [0, 1, 0], steps: 2 });
    if (!built.ok) throw new Error("unreachable");
    const made = await submit({ certificate: built.certificate });
    const id = made.json.mapId as string;
    const path = `/api/maps/${id}/retract`;
    const noModel = await call(modelMaps.GET, { path: "/api/models/nope/maps", params: { id: "nope" }, token: contributor });
    expect(noModel).toMatchObject({ status: 404, json: { error: { code: "not_found", field: "id" } } });
    expect((await call(retract.POST, { path: "/api/maps/nope/retract", method: "POST", body: { reason: "wrong" }, params: { id: "nope" }, token: curator })).status).toBe(404);
    expect((await call(retract.POST, { path, method: "POST", body: {}, params: { id }, token: curator })).json).toMatchObject({ error: { field: "reason" } });
    expect((await call(retract.POST, { path, method: "POST", body: { reason: "a typo in the labels" }, params: { id }, token: curator })).status).toBe(200);
    const again = await call(retract.POST, { path, method: "POST", body: { reason: "again" }, params: { id }, token: curator });
    expect(again).toMatchObject({ status: 409, json: { error: { code: "conflict" } } });
  });

  it("ask answers yes with the chain, no within a recorded search's bounds, or unknown", async () => {
    const all = await t.db.select().from(models).all();
    const oz = all.find((m) => m.states === 3 && m.kind === "markov" && m.name.includes("3 states") && JSON.parse(m.canonical).labels[0] === "R")!;
    const lumped = all.find((m) => m.states === 2)!;
    const yes = await call(ask.GET, { path: `/api/ask?from=${oz.id}&to=${lumped.id}`, token: contributor });
    expect(yes.json).toMatchObject({ answer: "yes", reason: "chain" });
    const unknown = await call(ask.GET, { path: `/api/ask?from=${lumped.id}&to=${oz.id}`, token: contributor });
    expect(unknown.json).toMatchObject({ answer: "unknown", reason: "no-search" });
    await createSearchRecord({
      workspaceId: ws,
      modelId: lumped.id,
      kind: "lumpings",
      maxBlock: null,
      algorithm: "all-partitions",
      algorithmVersion: "1",
      coverage: { targetKinds: ["markov"], partitions: "all" },
      outcome: { targets: [] },
    });
    const no = await call(ask.GET, { path: `/api/ask?from=${lumped.id}&to=${oz.id}`, token: contributor });
    expect(no.json).toMatchObject({ answer: "no", search: { algorithm: "all-partitions" }, withinBounds: { coverage: { partitions: "all" } } });
  });
});
