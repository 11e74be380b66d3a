import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as ask from "@/app/api/ask/route";
import * as certificateByAddress from "@/app/api/certificates/[address]/route";
import * as certificates from "@/app/api/certificates/route";
import * as chainById from "@/app/api/chains/[id]/route";
import * as chains from "@/app/api/chains/route";
import { setSessionReader } from "@/app/api/_lib/actor";
import * as retract from "@/app/api/maps/[id]/retract/route";
import * as mapById from "@/app/api/maps/[id]/route";
import * as symmetry from "@/app/api/maps/[id]/symmetry/route";
import * as modelMaps from "@/app/api/models/[id]/maps/route";
import * as modelById from "@/app/api/models/[id]/route";
import * as models from "@/app/api/models/route";
import * as paths from "@/app/api/paths/route";
import * as search from "@/app/api/search/route";
import * as tokenById from "@/app/api/tokens/[id]/route";
import * as tokens from "@/app/api/tokens/route";
import { getMap, setDatabase } from "@/db/queries/atlas";
import { ROLES, type Action, type Role } from "@/lib/policy";
import { closeVerificationPool } from "@/server/atlas/pool";
import { submitBuild, submitChain } from "@/server/atlas/submit";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { seedAtlasPeople } from "./atlas-fixtures";
import { call, tokenFor } from "./api-support";

const OZ = { kind: "markov", labels: ["R", "N", "S"], matrix: [["1/2", "1/4", "1/4"], ["1/2", "0", "1/2"], ["1/4", "1/4", "1/2"]] };

let t: TestDatabase;
let seeded: Awaited<ReturnType<typeof seedAtlasPeople>>;
const fixture = {} as {
  mapId: string;
  sourceId: string;
  targetId: string;
  address: string;
  chainMapIds: string[];
  chainId: string;
  retractable: Record<Role, string>;
};

/**
 * Who gets a 2xx, written out per endpoint rather than read from lib/policy (a test that asks can() for its
 * expectations passes whatever the table says). Everyone else gets 403.
 */
const EVERYONE: Role[] = ["viewer", "contributor", "curator", "admin"];
const CONTRIBUTORS: Role[] = ["contributor", "curator", "admin"];
const CURATORS: Role[] = ["curator", "admin"];
const ALLOWED: Record<string, Role[]> = {
  "GET /api/models": EVERYONE,
  "POST /api/models": CONTRIBUTORS,
  "GET /api/models/{id}": EVERYONE,
  "GET /api/models/{id}/maps": EVERYONE,
  "POST /api/certificates": CONTRIBUTORS,
  "GET /api/certificates/{address}": EVERYONE,
  "GET /api/maps/{id}": EVERYONE,
  "POST /api/maps/{id}/retract": CURATORS,
  "POST /api/maps/{id}/symmetry": CONTRIBUTORS,
  "GET /api/chains": EVERYONE,
  "POST /api/chains": CONTRIBUTORS,
  "GET /api/chains/{id}": EVERYONE,
  "GET /api/paths": EVERYONE,
  "GET /api/ask": EVERYONE,
  "GET /api/search": EVERYONE,
};
const expectedStatus = (role: Role, endpoint: string): "2xx" | 403 => {
  const allowed = ALLOWED[endpoint];
  if (!allowed) throw new Error(`no expected roles written for ${endpoint}`);
  return allowed.includes(role) ? "2xx" : 403;
};

type Endpoint = {
  name: string;
  /** The policy action the handler checks (documentation; the expected statuses come from ALLOWED). */
  action: Action;
  handler: unknown;
  request: (role: Role) => { path: string; method?: string; body?: unknown; params?: Record<string, string> };
};

const endpoints: Endpoint[] = [
  { name: "GET /api/models", action: "atlas:read", handler: models.GET, request: () => ({ path: "/api/models?kind=markov" }) },
  {
    name: "POST /api/models",
    action: "model:create",
    handler: models.POST,
    request: () => ({ path: "/api/models", method: "POST", body: { model: { kind: "eca", rule: 54 } } }),
  },
  {
    name: "GET /api/models/{id}",
    action: "atlas:read",
    handler: modelById.GET,
    request: () => ({ path: `/api/models/${fixture.sourceId}`, params: { id: fixture.sourceId } }),
  },
  {
    name: "GET /api/models/{id}/maps",
    action: "atlas:read",
    handler: modelMaps.GET,
    request: () => ({ path: `/api/models/${fixture.sourceId}/maps?direction=from`, params: { id: fixture.sourceId } }),
  },
  {
    name: "POST /api/certificates",
    action: "certificate:submit",
    handler: certificates.POST,
    request: () => ({ path: "/api/certificates", method: "POST", body: { build: { kind: "decimation", chain: OZ, steps: 3 } } }),
  },
  {
    name: "GET /api/certificates/{address}",
    action: "atlas:read",
    handler: certificateByAddress.GET,
    request: () => ({ path: `/api/certificates/${fixture.address}`, params: { address: fixture.address } }),
  },
  {
    name: "GET /api/maps/{id}",
    action: "atlas:read",
    handler: mapById.GET,
    request: () => ({ path: `/api/maps/${fixture.mapId}`, params: { id: fixture.mapId } }),
  },
  {
    name: "POST /api/maps/{id}/retract",
    action: "map:retract",
    handler: retract.POST,
    request: (role) => ({
      path: `/api/maps/${fixture.retractable[role]}/retract`,
      method: "POST",
      body: { reason: `checked by the ${role}` },
      params: { id: fixture.retractable[role] },
    }),
  },
  {
    name: "POST /api/maps/{id}/symmetry",
    action: "certificate:submit",
    handler: symmetry.POST,
    request: () => ({ path: `/api/maps/${fixture.mapId}/symmetry`, method: "POST", params: { id: fixture.mapId } }),
  },
  { name: "GET /api/chains", action: "atlas:read", handler: chains.GET, request: () => ({ path: "/api/chains" }) },
  {
    name: "POST /api/chains",
    action: "chain:submit",
    handler: chains.POST,
    request: () => ({ path: "/api/chains", method: "POST", body: { name: "Oz in two", mapIds: fixture.chainMapIds } }),
  },
  {
    name: "GET /api/chains/{id}",
    action: "atlas:read",
    handler: chainById.GET,
    request: () => ({ path: `/api/chains/${fixture.chainId}`, params: { id: fixture.chainId } }),
  },
  {
    name: "GET /api/paths",
    action: "atlas:read",
    handler: paths.GET,
    request: () => ({ path: `/api/paths?from=${fixture.sourceId}&to=${fixture.targetId}&maxDepth=3` }),
  },
  {
    name: "GET /api/ask",
    action: "atlas:read",
    handler: ask.GET,
    request: () => ({ path: `/api/ask?from=${fixture.sourceId}&to=${fixture.targetId}` }),
  },
  { name: "GET /api/search", action: "atlas:read", handler: search.GET, request: () => ({ path: "/api/search?target=maps&mapKind=lumping" }) },
];

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  seeded = await seedAtlasPeople(t.db);
  const ws = seeded.workspace.id;
  const userId = seeded.people.contributor.id;
  const dec = await submitBuild({ workspaceId: ws, userId, build: { kind: "decimation", chain: OZ, steps: 2 } });
  const decMap = (await getMap({ workspaceId: ws, mapId: dec.mapId }))!;
  const lumpedTarget = JSON.parse((await t.db.query.models.findFirst({ where: (m, { eq }) => eq(m.id, decMap.target.id) }))!.canonical);
  const lump = await submitBuild({ workspaceId: ws, userId, build: { kind: "lumping", chain: lumpedTarget, partition: [0, 1, 0] } });
  fixture.mapId = dec.mapId;
  fixture.address = dec.address;
  fixture.sourceId = decMap.source.id;
  fixture.targetId = (await getMap({ workspaceId: ws, mapId: lump.mapId }))!.target.id;
  fixture.chainMapIds = [dec.mapId, lump.mapId];
  fixture.chainId = (await submitChain({ workspaceId: ws, userId, name: "Oz", mapIds: fixture.chainMapIds })).chainId;
  fixture.retractable = {} as Record<Role, string>;
  for (const [i, role] of ROLES.entries()) {
    const made = await submitBuild({ workspaceId: ws, userId, build: { kind: "decimation", chain: OZ, steps: 5 + i } });
    fixture.retractable[role] = made.mapId;
  }
});
afterAll(async () => {
  setSessionReader(null);
  await closeVerificationPool();
  setDatabase(null);
  t.cleanup();
});

describe("each role against each endpoint, with the statuses written out", () => {
  it("without a session or a token every endpoint answers 401", async () => {
    setSessionReader(async () => null);
    for (const e of endpoints) {
      const res = await call(e.handler, e.request("viewer"));
      expect(res.status, e.name).toBe(401);
      expect(res.json).toMatchObject({ error: { code: "unauthenticated" } });
    }
  });

  it("a token of each role gets 2xx exactly where ALLOWED names its role, 403 elsewhere", async () => {
    setSessionReader(async () => null);
    for (const role of ROLES) {
      const token = await tokenFor(seeded.people[role].id, seeded.workspace.id, role);
      for (const e of endpoints) {
        const res = await call(e.handler, { ...e.request(role), token });
        if (expectedStatus(role, e.name) === "2xx") expect([200, 201], `${role} ${e.name}: ${JSON.stringify(res.json)}`).toContain(res.status);
        else expect(res.status, `${role} ${e.name}`).toBe(403);
      }
    }
  });

  it("a signed-in member of each role gets the same answers through the session", async () => {
    for (const role of ROLES) {
      const person = seeded.people[role];
      setSessionReader(async () => ({ id: person.id, email: person.email, name: role }));
      for (const e of endpoints) {
        if (e.action === "map:retract") continue; // each map retracts once; covered through tokens above
        const res = await call(e.handler, e.request(role));
        if (expectedStatus(role, e.name) === "2xx") expect([200, 201], `${role} ${e.name}: ${JSON.stringify(res.json)}`).toContain(res.status);
        else expect(res.status, `${role} ${e.name}`).toBe(403);
      }
    }
  });

  it("a signed-in person who belongs to no workspace is refused (403)", async () => {
    setSessionReader(async () => ({ id: seeded.outsider.id, email: seeded.outsider.email, name: "outsider" }));
    expect((await call(models.GET, { path: "/api/models" })).status).toBe(403);
  });
});

describe("tokens", () => {
  it("a session creates a token no higher than its role, sees it once, and revokes it; then the token is refused", async () => {
    const viewer = seeded.people.viewer;
    setSessionReader(async () => ({ id: viewer.id, email: viewer.email, name: "viewer" }));
    const tooHigh = await call(tokens.POST, { path: "/api/tokens", method: "POST", body: { name: "n", role: "contributor" } });
    expect(tooHigh).toMatchObject({ status: 403, json: { error: { field: "role" } } });
    const created = await call(tokens.POST, { path: "/api/tokens", method: "POST", body: { name: "notebook", role: "viewer" } });
    expect(created.status).toBe(201);
    const secret = created.json.secret as string;
    const id = (created.json.token as { id: string }).id;
    expect(secret).toMatch(/^sqt_/);
    const listed = await call(tokens.GET, { path: "/api/tokens" });
    expect(JSON.stringify(listed.json)).not.toContain(secret);
    setSessionReader(async () => null);
    expect((await call(models.GET, { path: "/api/models", token: secret })).status).toBe(200);
    expect((await call(tokens.GET, { path: "/api/tokens", token: secret })).status).toBe(403);
    setSessionReader(async () => ({ id: viewer.id, email: viewer.email, name: "viewer" }));
    expect((await call(tokenById.DELETE, { path: `/api/tokens/${id}`, method: "DELETE", params: { id } })).status).toBe(200);
    setSessionReader(async () => null);
    const after = await call(models.GET, { path: "/api/models", token: secret });
    expect(after).toMatchObject({ status: 401, json: { error: { code: "unauthenticated" } } });
  });

  it("a token acts with the lower of its role and its owner's current role", async () => {
    const admin = seeded.people.admin;
    const viewerToken = await tokenFor(admin.id, seeded.workspace.id, "viewer");
    const write = { path: "/api/models", method: "POST", body: { model: { kind: "eca", rule: 90 } } };
    expect((await call(models.POST, { ...write, token: viewerToken })).status).toBe(403);
    const curator = seeded.people.curator;
    const curatorToken = await tokenFor(curator.id, seeded.workspace.id, "curator");
    const { memberships } = await import("@/db/schema");
    const { and, eq } = await import("drizzle-orm");
    await t.db
      .update(memberships)
      .set({ role: "viewer" })
      .where(and(eq(memberships.userId, curator.id), eq(memberships.workspaceId, seeded.workspace.id)));
    expect((await call(models.POST, { ...write, token: curatorToken })).status).toBe(403);
    expect((await call(models.GET, { path: "/api/models", token: curatorToken })).status).toBe(200);
  });

  it("a malformed Authorization header or an unknown token is a 401 naming the header", async () => {
    for (const header of ["Basic abc", "Bearer", "Bearer sqt_unknown"]) {
      const res = await call(models.GET, { path: "/api/models", headers: { authorization: header } });
      expect(res, header).toMatchObject({ status: 401, json: { error: { field: "authorization" } } });
    }
  });
});
