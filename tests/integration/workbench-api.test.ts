import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as certifyRoute from "@/app/api/chains/workbench/route";
import { setDatabase } from "@/db/queries/atlas";
import { certificates, chains, maps, models } from "@/db/schema";
import { closeVerificationPool } from "@/server/atlas/pool";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { call, tokenFor } from "./api-support";
import { seedAtlasPeople } from "./atlas-fixtures";

let t: TestDatabase;
let seeded: Awaited<ReturnType<typeof seedAtlasPeople>>;
const tokens = {} as Record<"viewer" | "contributor", string>;

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  seeded = await seedAtlasPeople(t.db, "workbench-lab");
  for (const role of ["viewer", "contributor"] as const) tokens[role] = await tokenFor(seeded.people[role].id, seeded.workspace.id, role);
});
afterAll(async () => {
  setDatabase(null);
  await closeVerificationPool();
  await t?.cleanup();
});

const post = (token: string, body: unknown) => call(certifyRoute.POST, { path: "/api/chains/workbench", method: "POST", token, body });
const parity = { kind: "projection", block: 2, projection: [0, 1, 1, 0] };
const count = async () => ({
  models: (await t.db.select().from(models)).length,
  maps: (await t.db.select().from(maps)).length,
  chains: (await t.db.select().from(chains)).length,
});

describe("POST /api/chains/workbench", () => {
  it("certifies a new model, two maps whose targets it derives, and the chain, in one request (rule 105 → 150 → 150, Israeli & Goldenfeld, PRE 73, 026203, 2006)", async () => {
    const res = await post(tokens.contributor, {
      models: [{ key: "a", model: { kind: "eca", rule: 105 }, name: "Our rule 105" }, { key: "b" }, { key: "c", name: "Twice coarse" }],
      maps: [
        { key: "e1", source: "a", target: "b", spec: parity },
        { key: "e2", source: "b", target: "c", spec: parity },
      ],
      chain: { name: "105 by parity twice", links: [{ map: "e1" }, { map: "e2" }] },
    });
    expect(res.status).toBe(200);
    const body = res.json as { models: { key: string; name: string; model: unknown }[]; maps: { key: string; status: string; mapId: string }[]; chain: { status: string; chainId: string; verification: string } };
    expect(body.maps.map((m) => [m.key, m.status])).toEqual([["e1", "certified"], ["e2", "certified"]]);
    expect(body.chain).toMatchObject({ status: "created", verification: "links+composite" });
    const byKey = Object.fromEntries(body.models.map((m) => [m.key, m]));
    expect(byKey.a).toMatchObject({ name: "Our rule 105", model: { kind: "eca", rule: 105 } });
    // Both derived nodes are ECA 150; the name given to the second one is kept on the stored model.
    expect(byKey.b.model).toEqual({ kind: "eca", rule: 150 });
    expect(byKey.c).toMatchObject({ name: "Twice coarse", model: { kind: "eca", rule: 150 } });
    const [chain] = await t.db.select().from(chains).where(eq(chains.id, body.chain.chainId));
    const [composite] = await t.db.select().from(certificates).where(eq(certificates.address, chain.compositeCertificateAddress));
    // Parity of two block parities is the parity of the 4 cells, written out for the 16 block states.
    expect(JSON.parse(composite.body).map).toMatchObject({ kind: "projection", block: 4, projection: [0, 1, 1, 0, 1, 0, 0, 1, 1, 0, 0, 1, 0, 1, 1, 0] });
  });

  it("answers a failing square with its counterexample, skips the map after it and stores neither it nor the chain", async () => {
    const before = await count();
    const res = await post(tokens.contributor, {
      models: [{ key: "a", model: { kind: "eca", rule: 110 } }, { key: "b" }, { key: "c" }],
      maps: [
        { key: "bad", source: "a", target: "b", spec: { kind: "projection", block: 2, projection: [0, 0, 0, 1] } },
        { key: "next", source: "b", target: "c", spec: parity },
      ],
      chain: { name: "never", links: [{ map: "bad" }, { map: "next" }] },
    });
    expect(res.status).toBe(200);
    const body = res.json as { maps: { key: string; status: string; counterexample?: { kind: string } }[]; chain: { status: string } };
    expect(body.maps[0]).toMatchObject({ key: "bad", status: "refused", counterexample: { kind: "not-a-function" } });
    expect(body.maps[1]).toMatchObject({ key: "next", status: "skipped" });
    expect(body.chain.status).toBe("not-stored");
    const after = await count();
    // Only the drawn model (ECA 110) is new; no map, no chain.
    expect(after).toEqual({ ...before, models: before.models + 1 });
  });

  it("refuses a viewer with 403 and writes nothing", async () => {
    const before = await count();
    const res = await post(tokens.viewer, { models: [{ key: "a", model: { kind: "eca", rule: 90 } }, { key: "b" }], maps: [{ key: "e", source: "a", target: "b", spec: parity }] });
    expect(res.status).toBe(403);
    expect(await count()).toEqual(before);
  });

  it("names the field of a map that points at no node, and writes nothing", async () => {
    const before = await count();
    const res = await post(tokens.contributor, { models: [{ key: "a", model: { kind: "eca", rule: 90 } }], maps: [{ key: "e", source: "a", target: "zz", spec: parity }] });
    expect(res.status).toBe(400);
    expect((res.json.error as { field: string }).field).toBe("maps.0.target");
    expect(await count()).toEqual(before);
  });

  it("hands back the claim of a map too large for a request, for a job", async () => {
    // Block 9 is past the request's maxBlock (8): 2^27 windows.
    const res = await post(tokens.contributor, {
      models: [{ key: "a", model: { kind: "eca", rule: 204 } }, { key: "b" }],
      maps: [{ key: "big", source: "a", target: "b", spec: { kind: "blocking", block: 9 } }],
    });
    expect(res.status).toBe(200);
    const [m] = (res.json as { maps: { status: string; bound: string; build: unknown }[] }).maps;
    expect(m).toMatchObject({ status: "too-large", bound: "maxBlock", build: { kind: "blocking", rule: 204, block: 9 } });
  });
});
