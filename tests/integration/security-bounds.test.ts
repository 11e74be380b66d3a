import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import * as certificatesRoute from "@/app/api/certificates/route";
import * as modelsRoute from "@/app/api/models/route";
import { setDatabase } from "@/db/queries/atlas";
import { certificates, maps, models } from "@/db/schema";
import { closeVerificationPool } from "@/server/atlas/pool";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { seedAtlasPeople } from "./atlas-fixtures";
import { call, tokenFor } from "./api-support";

// The request thread must never canonicalise submitted data: these stand-ins count every call made
// on it. The worker thread loads the real modules on its own, so checks still run there.
const onRequestThread = vi.hoisted(() => ({ calls: [] as string[] }));
vi.mock("@/lib/certificate", async (original) => {
  const real = await original<typeof import("@/lib/certificate")>();
  return {
    ...real,
    certificateAddress: (...args: Parameters<typeof real.certificateAddress>) => {
      onRequestThread.calls.push("certificateAddress");
      return real.certificateAddress(...args);
    },
  };
});
vi.mock("@/lib/models", async (original) => {
  const real = await original<typeof import("@/lib/models")>();
  return {
    ...real,
    canonicalModel: (...args: Parameters<typeof real.canonicalModel>) => {
      onRequestThread.calls.push("canonicalModel");
      return real.canonicalModel(...args);
    },
  };
});

const { certifyLumping } = await vi.importActual<typeof import("@/lib/certificate")>("@/lib/certificate");

// Land of Oz chain: Grinstead & Snell, Introduction to Probability, Example 11.1.
const OZ = { kind: "markov", labels: ["R", "N", "S"], matrix: [["1/2", "1/4", "1/4"], ["1/2", "0", "1/2"], ["1/4", "1/4", "1/2"]] };

let t: TestDatabase;
let token: string;

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  const seeded = await seedAtlasPeople(t.db);
  token = await tokenFor(seeded.people.contributor.id, seeded.workspace.id, "contributor");
});
afterAll(async () => {
  await closeVerificationPool();
  setDatabase(null);
  t.cleanup();
});

async function counts() {
  const n = async (table: typeof maps | typeof models | typeof certificates) => (await t.db.select({ n: sql<number>`count(*)` }).from(table).get())!.n;
  return [await n(certificates), await n(models), await n(maps)];
}
const submit = (body: unknown) => call(certificatesRoute.POST, { path: "/api/certificates", method: "POST", body, token });
const createModel = (model: unknown) => call(modelsRoute.POST, { path: "/api/models", method: "POST", body: { model }, token });

/** A 2-state chain whose first row is 1/q, 1 − 1/q for a q of `digits` decimal digits. */
function longRationalChain(digits: number) {
  const q = BigInt(`9${"7".repeat(digits - 1)}`);
  return { kind: "markov", labels: ["a", "b"], matrix: [[`1/${q}`, `${q - 1n}/${q}`], ["1/2", "1/2"]] };
}

describe("no arithmetic on submitted data on the request thread (probe item 2)", () => {
  // Entry (0, 1) is (q − 1)/q: 12,000 digits above the bar and 12,000 below.
  it("a rational of 12,000 digits is refused with 413 naming maxEntryDigits, before any arithmetic", async () => {
    const before = await counts();
    const built = { format: "squarely-certificate", version: 1, map: { kind: "decimation", steps: 2 }, source: longRationalChain(12_000), target: OZ };
    const res = await submit({ certificate: built });
    expect(res).toMatchObject({
      status: 413,
      json: { error: { code: "too_large", field: "certificate.source.matrix.0.1", details: { bound: "maxEntryDigits", limit: 1000, asked: 24_000 } } },
    });
    const model = await createModel(longRationalChain(5_000));
    expect(model).toMatchObject({ status: 413, json: { error: { details: { bound: "maxEntryDigits" } } } });
    expect(await counts()).toEqual(before);
  });

  it("a certificate is addressed, checked and stored without canonicalising anything on the request thread", async () => {
    const built = certifyLumping({ chain: OZ, partition: [0, 1, 0] });
    if (!built.ok) throw new Error("the Oz lumping is lumpable (Grinstead & Snell, Example 11.1)");
    onRequestThread.calls.length = 0;
    const first = await submit({ certificate: built.certificate });
    expect(first.status).toBe(201);
    expect((await submit({ certificate: built.certificate })).status).toBe(200);
    expect((await createModel(OZ)).json).toMatchObject({ status: "existing" }); // stored as the lumping's source
    expect((await createModel({ kind: "eca", rule: 30 })).status).toBe(201);
    expect(onRequestThread.calls).toEqual([]);
  });
});

describe("every bound before any work (probe items 3 and 5)", () => {
  it("a decimation of 1,000,000 steps is 413 naming maxSteps, not a 400 about an entry after seconds of work", async () => {
    const res = await submit({ build: { kind: "decimation", chain: { kind: "markov", matrix: [["1/2", "1/2"], ["1/3", "2/3"]] }, steps: 1_000_000 } });
    expect(res).toMatchObject({ status: 413, json: { error: { code: "too_large", field: "build.steps", details: { bound: "maxSteps", limit: 4096, asked: 1_000_000 } } } });
  });

  it("a 200-state chain decimated 4,096 steps passes each bound alone but not the bound on its total cost", async () => {
    const n = 200;
    const row = Array.from({ length: n }, (_, j) => (j === 0 ? `${n - (n - 1)}/${n}` : `1/${n}`));
    const res = await submit({ build: { kind: "decimation", chain: { kind: "markov", matrix: Array.from({ length: n }, () => row) }, steps: 4096 } });
    expect(res).toMatchObject({ status: 413, json: { error: { details: { bound: "maxCost", limit: 20_000_000 } } } });
  });

  it("an iterate of too many steps names `steps`, not `block`", async () => {
    const res = await submit({ build: { kind: "iterate", rule: 110, steps: 40 } });
    expect(res.status).toBe(413);
    expect(res.json).toMatchObject({ error: { field: "build.steps", details: { bound: "maxWindows" } } });
  });
});

describe("odds and ends (probe item 12)", () => {
  it("a 700-state chain is not stored as a model: one bound on states everywhere (413 maxStates)", async () => {
    const n = 700;
    const matrix = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (j === i ? "1" : "0")));
    const before = await counts();
    const res = await createModel({ kind: "markov", matrix });
    expect(res).toMatchObject({ status: 413, json: { error: { details: { bound: "maxStates", limit: 200, asked: 700 } } } });
    const derived = await createModel({ kind: "decimated", base: OZ, steps: 5000 });
    expect(derived).toMatchObject({ status: 413, json: { error: { details: { bound: "maxSteps" } } } });
    expect(await counts()).toEqual(before);
  });

  it("a lumping of chains with long labels succeeds: the merged labels always fit", async () => {
    const long = (c: string) => c.repeat(150);
    const chain = { ...OZ, labels: [long("r"), long("n"), long("s")] };
    const res = await submit({ build: { kind: "lumping", chain, partition: [0, 1, 0] } });
    expect(res.status, JSON.stringify(res.json)).toBe(201);
    const target = (await t.db.select().from(models).all()).find((m) => m.states === 2 && m.canonical.includes("rrr"));
    const labels = JSON.parse(target!.canonical).labels as string[];
    expect(labels.every((l) => l.length <= 200)).toBe(true);
    expect(new Set(labels).size).toBe(2);
  });

  it("a body that is not valid UTF-8 is refused with 400, never stored with replacement characters", async () => {
    const before = await counts();
    const json = Buffer.from('{"model": {"kind": "markov", "labels": ["ok", "bad-\xff-label"], "matrix": [["1"]]}}', "latin1");
    const res = await modelsRoute.POST(
      new Request("http://localhost/api/models", { method: "POST", headers: { authorization: `Bearer ${token}`, "content-type": "application/json" }, body: json }),
      { params: Promise.resolve({}) as Promise<never> },
    );
    expect(res.status).toBe(400);
    expect(await res.json()).toMatchObject({ error: { code: "bad_input", field: "body", message: expect.stringContaining("UTF-8") } });
    expect(await counts()).toEqual(before);
  });
});
