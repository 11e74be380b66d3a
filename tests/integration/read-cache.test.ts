import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { encode } from "next-auth/jwt";
import { setSessionReader } from "@/app/api/_lib/actor";
import * as modelById from "@/app/api/models/[id]/route";
import * as models from "@/app/api/models/route";
import * as search from "@/app/api/search/route";
import { createDatabase, type Database } from "@/db/client";
import { setDatabase } from "@/db/queries/atlas";
import { changeMemberRole, removeMember } from "@/db/queries/memberships";
import { env } from "@/env";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { seedAtlasPeople } from "./atlas-fixtures";
import { call, tokenFor } from "./api-support";

/**
 * The read caches of app/api/_lib (actors, session decodes, atlas answers) against writes made on a
 * second client to the same file: another process, as far as this one can tell. Each write must
 * show in the very next request; nothing here waits for a cache to expire.
 */
let t: TestDatabase;
let other: Database;
let seeded: Awaited<ReturnType<typeof seedAtlasPeople>>;

const SESSION_COOKIE = "authjs.session-token";
const OZ = { kind: "markov", labels: ["R", "N", "S"], matrix: [["1/2", "1/4", "1/4"], ["1/2", "0", "1/2"], ["1/4", "1/4", "1/2"]] };

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  setSessionReader(null);
  other = createDatabase(t.url);
  seeded = await seedAtlasPeople(t.db, "cache-lab");
}, 60_000);

afterAll(() => {
  setDatabase(null);
  other.$client.close();
  t.cleanup();
});

async function insertModel(id: string, name: string): Promise<void> {
  await other.$client.execute({
    sql: "INSERT INTO models (id, workspace_id, address, kind, name, canonical, states) VALUES (?, ?, ?, 'markov', ?, ?, 2)",
    args: [id, seeded.workspace.id, `sha256:${id.padStart(64, "0")}`, name, '{"kind":"markov","labels":["a","b"],"matrix":[["1","0"],["0","1"]]}'],
  });
}

async function sessionCookie(user: { id: string; email: string }, maxAge?: number): Promise<string> {
  const jwt = await encode({ token: { sub: user.id, email: user.email, name: "x" }, secret: env.AUTH_SECRET, salt: SESSION_COOKIE, maxAge });
  return `${SESSION_COOKIE}=${jwt}`;
}

describe("tokens", () => {
  it("a token revoked by another process is refused at its next request, after its reads were answered", async () => {
    const token = await tokenFor(seeded.people.viewer.id, seeded.workspace.id, "viewer");
    for (let i = 0; i < 3; i++) expect((await call(models.GET, { path: "/api/models?limit=5", token })).status).toBe(200);
    await other.$client.execute({ sql: "UPDATE api_tokens SET revoked_at = ? WHERE user_id = ?", args: [Date.now(), seeded.people.viewer.id] });
    const refused = await call(models.GET, { path: "/api/models?limit=5", token });
    expect(refused.status).toBe(401);
    expect(JSON.stringify(refused.json)).toContain("unknown or revoked");
  });

  it("a lowered role is honoured at the next request", async () => {
    const token = await tokenFor(seeded.people.curator.id, seeded.workspace.id, "contributor");
    expect((await call(models.GET, { path: "/api/models?limit=5", token })).status).toBe(200);
    expect((await call(models.POST, { path: "/api/models", method: "POST", token, body: { model: OZ, name: "Land of Oz" } })).status).toBe(201);
    const changed = await changeMemberRole({ db: other, workspaceId: seeded.workspace.id, userId: seeded.people.curator.id, role: "viewer", actorId: seeded.people.admin.id });
    expect(changed).toBe("changed");
    const refused = await call(models.POST, { path: "/api/models", method: "POST", token, body: { model: OZ } });
    expect(refused.status).toBe(403);
    expect((await call(models.GET, { path: "/api/models?limit=5", token })).status).toBe(200);
  });

  it("a removed member's token stops working at the next request", async () => {
    const token = await tokenFor(seeded.people.contributor.id, seeded.workspace.id, "viewer");
    expect((await call(models.GET, { path: "/api/models?limit=5", token })).status).toBe(200);
    const removed = await removeMember({ db: other, workspaceId: seeded.workspace.id, userId: seeded.people.contributor.id, actorId: seeded.people.admin.id });
    expect(removed).toBe("changed");
    expect((await call(models.GET, { path: "/api/models?limit=5", token })).status).toBe(401);
  });
});

describe("atlas answers", () => {
  it("a model written by another process is in the next list and search", async () => {
    const token = await tokenFor(seeded.people.admin.id, seeded.workspace.id, "viewer", "lister");
    const before = await call(models.GET, { path: "/api/models?limit=100", token });
    const found = await call(search.GET, { path: "/api/search?target=models&q=Quincunx", token });
    expect(found.json.items).toEqual([]);
    await insertModel("cache-new", "Quincunx chain");
    const after = await call(models.GET, { path: "/api/models?limit=100", token });
    expect((after.json.items as unknown[]).length).toBe((before.json.items as unknown[]).length + 1);
    const again = await call(search.GET, { path: "/api/search?target=models&q=Quincunx", token });
    expect((again.json.items as { name: string }[]).map((m) => m.name)).toEqual(["Quincunx chain"]);
  });

  it("a renamed model reads with its new name at once, and a write that bypasses the counters is not seen (the answer was cached)", async () => {
    const token = await tokenFor(seeded.people.admin.id, seeded.workspace.id, "viewer", "renamer");
    await insertModel("cache-rename", "Before");
    const get = () => call(modelById.GET, { path: "/api/models/cache-rename", token, params: { id: "cache-rename" } });
    expect((await get()).json.name).toBe("Before");
    await other.$client.execute("UPDATE models SET name = 'After' WHERE id = 'cache-rename'");
    expect((await get()).json.name).toBe("After");
    // Without its trigger the same kind of write leaves the counter alone: the cached answer stays.
    await other.$client.execute("DROP TRIGGER read_versions_models_au");
    await other.$client.execute("UPDATE models SET name = 'Unseen' WHERE id = 'cache-rename'");
    expect((await get()).json.name).toBe("After");
    await other.$client.execute("UPDATE read_versions SET version = version + 1 WHERE scope = 'atlas:' || ?", [seeded.workspace.id]);
    expect((await get()).json.name).toBe("Unseen");
  });

  it("a missing model is a 404 each time, never a cached answer", async () => {
    const token = await tokenFor(seeded.people.admin.id, seeded.workspace.id, "viewer", "missing");
    const get = () => call(modelById.GET, { path: "/api/models/cache-later", token, params: { id: "cache-later" } });
    expect((await get()).status).toBe(404);
    await insertModel("cache-later", "Later");
    const found = await get();
    expect(found.status).toBe(200);
    expect(found.json.name).toBe("Later");
  });
});

describe("sessions", () => {
  it("a session cookie reads; its deleted account is refused at the next request", async () => {
    const [user] = (
      await other.$client.execute({
        sql: "INSERT INTO users (id, email, name) VALUES ('cache-person', 'person@cache-lab.test', 'A person') RETURNING id, email",
      })
    ).rows as unknown as { id: string; email: string }[];
    await other.$client.execute({ sql: "INSERT INTO memberships (workspace_id, user_id, role) VALUES (?, ?, 'viewer')", args: [seeded.workspace.id, user.id] });
    const cookie = await sessionCookie(user);
    for (let i = 0; i < 3; i++) expect((await call(models.GET, { path: "/api/models?limit=5", headers: { cookie } })).status).toBe(200);
    await other.$client.execute("DELETE FROM users WHERE id = 'cache-person'");
    expect((await call(models.GET, { path: "/api/models?limit=5", headers: { cookie } })).status).toBe(401);
  });

  it("a session whose last membership is removed gets the 403 that says so", async () => {
    const cookie = await sessionCookie(seeded.people.curator);
    expect((await call(models.GET, { path: "/api/models?limit=5", headers: { cookie } })).status).toBe(200);
    await other.$client.execute({ sql: "DELETE FROM memberships WHERE user_id = ?", args: [seeded.people.curator.id] });
    const refused = await call(models.GET, { path: "/api/models?limit=5", headers: { cookie } });
    expect(refused.status).toBe(403);
    expect(JSON.stringify(refused.json)).toContain("not a member of any workspace");
  });

  it("a session's role change is honoured at the next write", async () => {
    const cookie = await sessionCookie(seeded.people.admin);
    const post = () => call(models.POST, { path: "/api/models", method: "POST", headers: { cookie }, body: { model: OZ } });
    expect((await post()).status).toBe(200);
    await other.$client.execute({ sql: "UPDATE memberships SET role = 'viewer' WHERE user_id = ?", args: [seeded.people.admin.id] });
    expect((await post()).status).toBe(403);
  });

  it("an expired session cookie is refused, and a cross-site write by cookie still is", async () => {
    const expired = await sessionCookie(seeded.people.viewer, -60);
    expect((await call(models.GET, { path: "/api/models?limit=5", headers: { cookie: expired } })).status).toBe(401);
    const cookie = await sessionCookie(seeded.people.viewer);
    expect((await call(models.GET, { path: "/api/models?limit=5", headers: { cookie } })).status).toBe(200);
    const crossSite = await call(models.POST, { path: "/api/models", method: "POST", headers: { cookie, origin: "https://elsewhere.example" }, body: { model: OZ } });
    expect(crossSite.status).toBe(403);
    expect(crossSite.json.error).toMatchObject({ field: "origin" });
  });
});
