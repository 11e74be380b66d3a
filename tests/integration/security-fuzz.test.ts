import fc from "fast-check";
import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openApiDocument } from "@/app/api/_lib/openapi";
import { setSessionReader } from "@/app/api/_lib/actor";
import { setDatabase } from "@/db/queries/atlas";
import { closeVerificationPool } from "@/server/atlas/pool";
import { submitBuild } from "@/server/atlas/submit";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { seedAtlasPeople } from "./atlas-fixtures";
import { tokenFor } from "./api-support";

/**
 * Bad bodies, queries and path parameters for every operation of the OpenAPI document, sent to the
 * route handlers in-process: no answer may be a 5xx, and a refused request may change no row.
 */
type Operation = {
  parameters?: { name: string; in: "query" | "path" }[];
  requestBody?: unknown;
};
type Handler = (request: Request, context: { params: Promise<Record<string, string>> }) => Promise<Response>;

const ROUTE_MODULES = import.meta.glob<Record<string, Handler>>("../../app/api/**/route.ts");

// Land of Oz chain: Grinstead & Snell, Introduction to Probability, Example 11.1.
const OZ = { kind: "markov", labels: ["R", "N", "S"], matrix: [["1/2", "1/4", "1/4"], ["1/2", "0", "1/2"], ["1/4", "1/4", "1/2"]] };

let t: TestDatabase;
let seeded: Awaited<ReturnType<typeof seedAtlasPeople>>;
const tokens: Record<string, string> = {};
const known: string[] = [];

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  seeded = await seedAtlasPeople(t.db);
  for (const role of ["viewer", "curator", "admin"] as const) tokens[role] = await tokenFor(seeded.people[role].id, seeded.workspace.id, role);
  const made = await submitBuild({ workspaceId: seeded.workspace.id, userId: seeded.people.curator.id, build: { kind: "lumping", chain: OZ, partition: [0, 1, 0] } });
  known.push(made.mapId, made.address);
});
afterAll(async () => {
  setSessionReader(null);
  await closeVerificationPool();
  setDatabase(null);
  t.cleanup();
});

/** Every table's row count in one statement. */
async function rowCounts(): Promise<Record<string, number>> {
  const tables = (await t.db.all<{ name: string }>(sql`select name from sqlite_master where type = 'table' and name not like 'sqlite_%' and name not like '__drizzle%'`)).map((r) => r.name);
  const counts = sql.join(tables.map((name) => sql`(select count(*) from ${sql.identifier(name)}) as ${sql.identifier(name)}`), sql`, `);
  return (await t.db.all<Record<string, number>>(sql`select ${counts}`))[0];
}

const weirdText = fc.oneof(
  fc.string({ maxLength: 40 }),
  fc.string({ unit: "binary", maxLength: 40 }),
  fc.constantFrom("%ff", "%", "", " ", "0", "-1", "1e309", "NaN", "null", "sha256:" + "0".repeat(64), "a".repeat(5000), "../../etc/passwd", "\u0000", "\ud800", "9".repeat(400)),
);
const pathValue = fc.oneof(weirdText, fc.constantFrom(...["known-map", "known-address"]).map((k) => known[k === "known-map" ? 0 : 1]));
const queryValue = fc.oneof(weirdText, fc.integer().map(String), fc.double().map(String));

/**
 * The URL needs well-formed text; the handler still gets the raw value (a lone surrogate included),
 * which is more than a real request can carry once the router has decoded its path.
 */
function wellFormed(text: string): string {
  return text.replace(/[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/g, "\ufffd");
}

/** Replaces the n-th node of a value (depth first) with `replacement`. */
function mutate(value: unknown, n: number, replacement: unknown): unknown {
  let i = 0;
  const walk = (v: unknown): unknown => {
    if (i++ === n) return replacement;
    if (Array.isArray(v)) return v.map(walk);
    if (v && typeof v === "object") return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, walk(x)]));
    return v;
  };
  return walk(structuredClone(value));
}

const EXAMPLES: unknown[] = [
  { build: { kind: "lumping", chain: OZ, partition: [0, 1, 0] } },
  { build: { kind: "decimation", chain: OZ, steps: 3 } },
  { build: { kind: "projection", rule: 90, block: 2, projection: "0110" } },
  { model: OZ },
  { model: { kind: "supercell", base: { kind: "eca", rule: 30 }, block: 2 } },
  { name: "a chain", mapIds: ["x"] },
  { kind: "lump-chain", params: { chain: OZ } },
  { reason: "a typo" },
  { text: "a note" },
  { modelId: "x" },
  { name: "token", role: "viewer" },
];
const badBody = fc.oneof(
  fc.anything(),
  fc.json(),
  fc.string({ maxLength: 200 }),
  fc.tuple(fc.constantFrom(...EXAMPLES), fc.nat({ max: 40 }), fc.anything()).map(([e, n, r]) => mutate(e, n, r)),
);
const caller = fc.constantFrom("viewer", "curator", "admin", "session", "nobody");

const doc = openApiDocument() as unknown as { paths: Record<string, Record<string, Operation>> };
const operations = Object.entries(doc.paths).flatMap(([path, item]) => Object.entries(item).map(([method, op]) => ({ path, method: method.toUpperCase(), op })));

describe("fuzzing every route of the OpenAPI document", () => {
  it("covers every documented path with a route module", () => {
    expect(operations.length).toBeGreaterThan(20);
    for (const { path } of operations) expect(ROUTE_MODULES, path).toHaveProperty([`../../app${path.replace(/\{(\w+)\}/g, "[$1]")}/route.ts`]);
  });

  it.each(operations.map((o) => [`${o.method} ${o.path}`, o] as const))("%s: no 5xx, and a refused request writes nothing", async (_name, { path, method, op }) => {
    const handler = (await ROUTE_MODULES[`../../app${path.replace(/\{(\w+)\}/g, "[$1]")}/route.ts`]())[method];
    const pathParams = (op.parameters ?? []).filter((p) => p.in === "path").map((p) => p.name);
    const queryParams = (op.parameters ?? []).filter((p) => p.in === "query").map((p) => p.name);
    await fc.assert(
      fc.asyncProperty(
        fc.record({
          params: fc.tuple(...pathParams.map(() => pathValue)),
          query: fc.dictionary(fc.oneof(fc.constantFrom(...queryParams, "x"), fc.string({ maxLength: 8 })), queryValue, { maxKeys: 4 }),
          body: op.requestBody ? badBody : fc.constant(undefined),
          who: caller,
        }),
        async ({ params, query, body, who }) => {
          const values = Object.fromEntries(pathParams.map((name, i) => [name, params[i]]));
          const url = new URL(`http://localhost${path.replace(/\{(\w+)\}/g, (_, name: string) => encodeURIComponent(wellFormed(values[name])))}`);
          for (const [k, v] of Object.entries(query)) url.searchParams.append(k, v);
          const headers: Record<string, string> = { "content-type": "application/json" };
          if (who in tokens) headers.authorization = `Bearer ${tokens[who]}`;
          if (who === "session") headers.origin = "http://localhost";
          setSessionReader(async () => (who === "session" ? { id: seeded.people.contributor.id, email: seeded.people.contributor.email, name: "c" } : null));
          const init: RequestInit = { method, headers };
          if (body !== undefined) init.body = typeof body === "string" ? body : JSON.stringify(body) ?? "null";
          const before = await rowCounts();
          const res = await handler(new Request(url, init), { params: Promise.resolve(values) });
          const text = await res.text();
          expect(res.status, `${method} ${url.pathname}${url.search} ${String(init.body ?? "").slice(0, 200)} → ${text.slice(0, 300)}`).toBeLessThan(500);
          if (res.status >= 400) {
            expect(await rowCounts()).toEqual(before);
            expect(JSON.parse(text)).toMatchObject({ error: { code: expect.any(String), message: expect.any(String) } });
          }
        },
      ),
      { numRuns: 25 },
    );
  });
});
