import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as certificateByAddress from "@/app/api/certificates/[address]/route";
import * as certificates from "@/app/api/certificates/route";
import * as notes from "@/app/api/notes/route";
import { GET as openApi } from "@/app/api/openapi.json/route";
import * as tokens from "@/app/api/tokens/route";
import { setSessionReader } from "@/app/api/_lib/actor";
import { setDatabase } from "@/db/queries/atlas";
import { apiTokens, auditEvents } from "@/db/schema";
import { closeVerificationPool } from "@/server/atlas/pool";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { seedAtlasPeople } from "./atlas-fixtures";
import { call, tokenFor } from "./api-support";

// Land of Oz chain: Grinstead & Snell, Introduction to Probability, Example 11.1.
const OZ = { kind: "markov", labels: ["R", "N", "S"], matrix: [["1/2", "1/4", "1/4"], ["1/2", "0", "1/2"], ["1/4", "1/4", "1/2"]] };

let t: TestDatabase;
let labA: Awaited<ReturnType<typeof seedAtlasPeople>>;
let labB: Awaited<ReturnType<typeof seedAtlasPeople>>;

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  labA = await seedAtlasPeople(t.db, "lab-a");
  labB = await seedAtlasPeople(t.db, "lab-b");
});
afterAll(async () => {
  setSessionReader(null);
  await closeVerificationPool();
  setDatabase(null);
  t.cleanup();
});

const rows = async (table: typeof auditEvents | typeof apiTokens) => (await t.db.select({ n: sql<number>`count(*)` }).from(table).get())!.n;
const signIn = (who: { id: string; email: string }) => setSessionReader(async () => ({ id: who.id, email: who.email, name: who.email }));

describe("certificates are read through a workspace (probe item 6)", () => {
  it("another workspace's certificate is a 404, exactly like one that does not exist; its own workspace reads it", async () => {
    const tokenA = await tokenFor(labA.people.contributor.id, labA.workspace.id, "contributor");
    const tokenB = await tokenFor(labB.people.admin.id, labB.workspace.id, "admin");
    const made = await call(certificates.POST, {
      path: "/api/certificates",
      method: "POST",
      body: { build: { kind: "lumping", chain: { ...OZ, labels: ["private rain", "private nice", "private snow"] }, partition: [0, 1, 0] } },
      token: tokenA,
    });
    expect(made.status).toBe(201);
    const address = made.json.address as string;
    const read = (token: string, at = address) => call(certificateByAddress.GET, { path: `/api/certificates/${at}`, params: { address: at }, token });

    const own = await read(tokenA);
    expect(own.status).toBe(200);
    expect(JSON.stringify(own.json)).toContain("private rain");

    const foreign = await read(tokenB);
    expect(foreign).toMatchObject({ status: 404, json: { error: { code: "not_found", field: "address" } } });
    expect(JSON.stringify(foreign.json)).not.toContain("private");
    const missing = await read(tokenB, `sha256:${"0".repeat(64)}`);
    expect(missing.status).toBe(404);
    expect(Object.keys(missing.json.error as object)).toEqual(Object.keys(foreign.json.error as object));
  });
});

describe("cookie-authenticated writes come from this site as JSON (probe item 7)", () => {
  const note = { text: "block 2 supercell of rule 60 next" };

  it("refuses a text/plain body and a foreign or missing Origin, and writes nothing", async () => {
    signIn(labA.people.admin);
    const before = [await rows(auditEvents), await rows(apiTokens)];
    // A page on another port of the same host is another origin (RFC 6454 §4: scheme, host and port).
    const otherPort = await call(notes.POST, { path: "/api/notes", method: "POST", body: note, headers: { origin: "http://localhost:3001" } });
    expect(otherPort).toMatchObject({ status: 403, json: { error: { code: "forbidden", field: "origin" } } });
    const plain = await call(notes.POST, { path: "/api/notes", method: "POST", body: JSON.stringify(note), headers: { "content-type": "text/plain" } });
    expect(plain).toMatchObject({ status: 415, json: { error: { code: "unsupported_media_type", field: "content-type" } } });
    const form = await call(notes.POST, { path: "/api/notes", method: "POST", body: "text=hi", headers: { "content-type": "application/x-www-form-urlencoded" } });
    expect(form.status).toBe(415);
    const noOrigin = await call(notes.POST, { path: "/api/notes", method: "POST", body: note, headers: { origin: "", "sec-fetch-site": "cross-site" } });
    expect(noOrigin.status).toBe(403);
    const opaque = await call(notes.POST, { path: "/api/notes", method: "POST", body: note, headers: { origin: "null" } });
    expect(opaque.status).toBe(403);
    const mint = await call(tokens.POST, {
      path: "/api/tokens",
      method: "POST",
      body: JSON.stringify({ name: "stolen", role: "admin" }),
      headers: { origin: "http://localhost:3001", "content-type": "text/plain" },
    });
    expect(mint.status).toBe(403);
    expect([await rows(auditEvents), await rows(apiTokens)]).toEqual(before);
  });

  it("accepts the app's own JSON writes, and Bearer-token requests as before", async () => {
    signIn(labA.people.contributor);
    const own = await call(notes.POST, { path: "/api/notes", method: "POST", body: note, headers: { origin: "http://localhost" } });
    expect(own.status).toBe(201);
    const fetchMetadata = await call(notes.POST, { path: "/api/notes", method: "POST", body: note, headers: { origin: "", "sec-fetch-site": "same-origin" } });
    expect(fetchMetadata.status).toBe(201);
    setSessionReader(async () => null);
    const token = await tokenFor(labA.people.contributor.id, labA.workspace.id, "contributor");
    const script = await call(notes.POST, {
      path: "/api/notes",
      method: "POST",
      body: JSON.stringify(note),
      token,
      headers: { "content-type": "text/plain", origin: "http://elsewhere.example" },
    });
    expect(script.status).toBe(201);
  });
});

describe("/api/notes like every other route (probe item 12)", () => {
  it("accepts tokens: a viewer reads the log, a contributor posts, a viewer may not post", async () => {
    setSessionReader(async () => null);
    const viewer = await tokenFor(labB.people.viewer.id, labB.workspace.id, "viewer");
    const contributor = await tokenFor(labB.people.contributor.id, labB.workspace.id, "contributor");
    const posted = await call(notes.POST, { path: "/api/notes", method: "POST", body: { text: "lab B's first note" }, token: contributor });
    expect(posted.status).toBe(201);
    const log = await call(notes.GET, { path: "/api/notes", token: viewer });
    expect(log.status).toBe(200);
    expect(log.json.notes).toBe(1);
    expect(JSON.stringify(log.json.items)).toContain("lab B's first note");
    expect(JSON.stringify(log.json.items)).not.toContain("supercell of rule 60"); // lab A's notes stay in lab A
    const refused = await call(notes.POST, { path: "/api/notes", method: "POST", body: { text: "viewer tries" }, token: viewer });
    expect(refused).toMatchObject({ status: 403, json: { error: { code: "forbidden" } } });
    const blank = await call(notes.POST, { path: "/api/notes", method: "POST", body: { text: "  " }, token: contributor });
    expect(blank).toMatchObject({ status: 400, json: { error: { code: "bad_input", field: "text" } } });
  });

  it("is in the OpenAPI document with both methods", async () => {
    const doc = (await (await openApi(new Request("http://local/api/openapi.json"), { params: Promise.resolve({}) })).json()) as {
      paths: Record<string, Record<string, unknown>>;
    };
    expect(Object.keys(doc.paths["/api/notes"] ?? {}).sort()).toEqual(["get", "post"]);
  });
});
