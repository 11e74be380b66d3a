import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sql } from "drizzle-orm";
import { getMap, setDatabase } from "@/db/queries/atlas";
import { auditEvents, certificates, maps, models, notificationOutbox } from "@/db/schema";
import { certifyDecimation, certifyLumping, sealCertificate } from "@/lib/certificate";
import { closeVerificationPool, runVerification } from "@/server/atlas/pool";
import { ensureModel, submitBuild, submitCertificate, submitChain, submitSymmetricImages } from "@/server/atlas/submit";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { seedAtlasPeople } from "./atlas-fixtures";

// Land of Oz weather chain (rain, nice, snow): Grinstead & Snell, Introduction to Probability, Example 11.1.
const OZ = { kind: "markov", labels: ["R", "N", "S"], matrix: [["1/2", "1/4", "1/4"], ["1/2", "0", "1/2"], ["1/4", "1/4", "1/2"]] };
// Lumping {R, S}, {N}: both R and S move into {R, S} with probability 3/4 (each row sums checked by hand
// from the matrix above), so the chain is lumpable; {R, N}, {S} is not (R → S is 1/4, N → S is 1/2).
const LUMPABLE = [0, 1, 0];
const NOT_LUMPABLE = [0, 0, 1];

let t: TestDatabase;
let ws: string;
let userId: string;

async function rowCounts() {
  const n = async (table: typeof maps | typeof models | typeof certificates | typeof auditEvents | typeof notificationOutbox) =>
    (await t.db.select({ n: sql<number>`count(*)` }).from(table).get())!.n;
  return [await n(certificates), await n(models), await n(maps), await n(auditEvents), await n(notificationOutbox)];
}

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  const seeded = await seedAtlasPeople(t.db);
  ws = seeded.workspace.id;
  userId = seeded.people.contributor.id;
});
afterAll(async () => {
  await closeVerificationPool();
  setDatabase(null);
  t.cleanup();
});

describe("server-side verification in a worker thread", () => {
  it("the worker runs the core's checker: the Oz lumping holds with the lumped chain [[3/4, 1/4], [1, 0]]", async () => {
    const built = certifyLumping({ chain: OZ, partition: LUMPABLE });
    if (!built.ok) throw new Error("the Oz lumping should hold");
    const outcome = await runVerification({ op: "verify", certificate: built.certificate });
    expect(outcome.status).toBe("holds");
    if (outcome.status !== "holds") return;
    expect(JSON.parse(outcome.target.canonical).matrix).toEqual([["3/4", "1/4"], ["1", "0"]]);
    expect(outcome.source.states).toBe(3);
  });

  it("a certificate submitted twice is one map; a second spelling of it (decimals) is the same map", async () => {
    const built = certifyLumping({ chain: OZ, partition: LUMPABLE });
    if (!built.ok) throw new Error("unreachable");
    const first = await submitCertificate({ workspaceId: ws, userId, certificate: built.certificate });
    expect(first.status).toBe("created");
    const counts = await rowCounts();
    const again = await submitCertificate({ workspaceId: ws, userId, certificate: built.certificate });
    expect(again).toEqual({ ...first, status: "existing" });
    const decimal = { ...built.certificate, address: undefined, source: { ...OZ, matrix: [["0.5", "0.25", "0.25"], ["0.5", "0", "0.5"], ["0.25", "0.25", "0.5"]] } };
    const respelled = await submitCertificate({ workspaceId: ws, userId, certificate: decimal });
    expect(respelled.mapId).toBe(first.mapId);
    expect(await rowCounts()).toEqual(counts);
    const map = await getMap({ workspaceId: ws, mapId: first.mapId });
    expect(map).toMatchObject({ kind: "lumping", status: "certified" });
  });

  it("a lumping that does not hold is refused with the counterexample and writes nothing", async () => {
    const good = certifyLumping({ chain: OZ, partition: LUMPABLE });
    if (!good.ok) throw new Error("unreachable");
    // The same claim with another partition: the certificate is well formed, its square does not commute.
    const forged = sealCertificate({ ...good.certificate, address: undefined, map: { kind: "lumping", partition: NOT_LUMPABLE, steps: 1 } });
    const before = await rowCounts();
    const err = await submitCertificate({ workspaceId: ws, userId, certificate: forged }).catch((e: unknown) => e);
    expect(err).toMatchObject({ code: "does_not_commute", status: 422 });
    expect(JSON.stringify((err as { details: unknown }).details)).toMatch(/counterexample/);
    expect(await rowCounts()).toEqual(before);
  });

  it("building on the server refuses a non-lumpable partition with the two states and their sums", async () => {
    const before = await rowCounts();
    const err = await submitBuild({ workspaceId: ws, userId, build: { kind: "lumping", chain: OZ, partition: NOT_LUMPABLE } }).catch(
      (e: unknown) => e,
    );
    expect(err).toMatchObject({ code: "does_not_commute", details: { counterexample: { kind: "not-lumpable" } } });
    expect(await rowCounts()).toEqual(before);
    const made = await submitBuild({ workspaceId: ws, userId, build: { kind: "decimation", chain: OZ, steps: 2 } });
    expect(made.status).toBe("created");
  });

  it("a malformed certificate is a 400 naming the field", async () => {
    const err = await submitCertificate({ workspaceId: ws, userId, certificate: { format: "squarely-certificate", version: 1 } }).catch(
      (e: unknown) => e,
    );
    expect(err).toMatchObject({ code: "bad_input", status: 400 });
    expect((err as { field: string }).field).toMatch(/^certificate\./);
  });

  it("a check beyond the time bound is stopped and answered 413", async () => {
    // A square that commutes (rule 204 is the identity, so every projection does), so the check cannot stop
    // early at a counterexample: it must visit all 2^24 windows, far beyond a 50 ms bound on any machine.
    const big = { kind: "projection" as const, rule: 204, block: 8, projection: "0".repeat(128) + "1".repeat(128) };
    const err = await runVerification({ op: "build", build: big }, { sizes: { maxBlock: 8, maxAlphabet: 256, maxStates: 200, maxWindows: 2 ** 24, maxDigits: 10_000, maxSteps: 64 }, timeoutMs: 50, memoryMb: 256 }).catch(
      (e: unknown) => e,
    );
    expect(err).toMatchObject({ code: "too_large", details: { bound: "time" } });
  });

  it("ensureModel stores a model once, whatever its spelling", async () => {
    const a = await ensureModel({ workspaceId: ws, userId, model: { kind: "ca", k: 2, r: 1, table: [0, 1, 1, 1, 0, 1, 1, 0] } });
    const b = await ensureModel({ workspaceId: ws, userId, model: { kind: "eca", rule: 110 } });
    expect(a.model.name).toBe("ECA 110");
    expect(b).toMatchObject({ status: "existing", model: { id: a.model.id } });
    await expect(ensureModel({ workspaceId: ws, userId, model: { kind: "eca", rule: 300 } })).rejects.toMatchObject({
      code: "bad_input",
      field: expect.stringMatching(/^model/),
    });
  });

  it("a chain decimation-then-lumping of the Oz chain is stored once; a chain whose links do not meet is refused at that link", async () => {
    // Lumping commutes with decimation (DOMAIN.md §3): P² of a lumpable chain lumps by the same partition.
    const dec = certifyDecimation({ chain: OZ, steps: 2 });
    if (!dec.ok) throw new Error("unreachable");
    const lump = certifyLumping({ chain: dec.certificate.target, partition: LUMPABLE });
    if (!lump.ok) throw new Error("P² of the Oz chain should lump by {R, S}, {N}");
    const first = await submitCertificate({ workspaceId: ws, userId, certificate: dec.certificate });
    const second = await submitCertificate({ workspaceId: ws, userId, certificate: lump.certificate });
    const chain = await submitChain({ workspaceId: ws, userId, name: "Oz, two days, lumped", mapIds: [first.mapId, second.mapId] });
    expect(chain.status).toBe("created");
    expect(chain.verification).toBe("links+composite");
    const again = await submitChain({ workspaceId: ws, userId, name: "again", mapIds: [first.mapId, second.mapId] });
    expect(again).toMatchObject({ status: "existing", chainId: chain.chainId });
    const before = await rowCounts();
    const err = await submitChain({ workspaceId: ws, userId, name: "backwards", mapIds: [second.mapId, first.mapId] }).catch((e: unknown) => e);
    expect(err).toMatchObject({ code: "does_not_commute", field: "mapIds.0", details: { link: 0 } });
    expect(await rowCounts()).toEqual(before);
    await expect(submitChain({ workspaceId: ws, userId, name: "x", mapIds: [first.mapId, "no-such-map"] })).rejects.toMatchObject({
      code: "not_found",
      field: "mapIds.1",
    });
  });

  it("symmetry images are verified and stored as derived: the left shift (rule 240) reflects to the right shift (rule 170)", async () => {
    // Rules 240 and 170 copy the left and right neighbour (Wolfram, Rev. Mod. Phys. 55, 601, 1983; DOMAIN.md §1).
    // Two steps of a one-cell shift move a block of 2 by one block, so "first cell of the block" projects
    // rule 240 onto itself; its mirror image must project rule 170 onto itself.
    const made = await submitBuild({ workspaceId: ws, userId, build: { kind: "projection", rule: 240, block: 2, projection: "0011" } });
    const result = await submitSymmetricImages({ workspaceId: ws, userId, mapId: made.mapId });
    expect(result.created).toHaveLength(1);
    const image = (await getMap({ workspaceId: ws, mapId: result.created[0].mapId }))!;
    expect(image).toMatchObject({ derivation: "reflect", derivedFromMapId: made.mapId, source: { rule: 170 }, target: { rule: 170 } });
    // 240 is its own complement, so the complemented images repeat certificates already in the set.
    expect(result.skipped.map((s) => s.derivation).sort()).toEqual(["complement", "reflect-complement"]);
    const again = await submitSymmetricImages({ workspaceId: ws, userId, mapId: made.mapId });
    expect(again.created.map((c) => c.status)).toEqual(["existing"]);
  });
});
