import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq, sql } from "drizzle-orm";
import { createSearchRecord, retractMap, setDatabase } from "@/db/queries/atlas";
import { updateModelDetails } from "@/db/queries/models";
import { maps, models, workspaces } from "@/db/schema";
import { closeVerificationPool } from "@/server/atlas/pool";
import { submitBuild, submitChain } from "@/server/atlas/submit";
import { WorkspaceBundle } from "@/server/bundle/bundle-schema";
import { exportWorkspaceBundle, exportWorkspaceGraphml, importWorkspaceBundle, verifyBundle } from "@/server/bundle/workspace-bundle";
import { isAppError } from "@/server/errors";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { seedAtlasPeople } from "./atlas-fixtures";

// Land of Oz weather chain (Grinstead & Snell, Introduction to Probability, Example 11.1); {R, S}, {N} lumps.
const OZ = { kind: "markov", labels: ["R", "N", "S"], matrix: [["1/2", "1/4", "1/4"], ["1/2", "0", "1/2"], ["1/4", "1/4", "1/2"]] };

let t: TestDatabase;
let source: string;
let userId: string;
let bundleText: string;

async function modelCount(workspaceId: string): Promise<number> {
  return (await t.db.select({ n: sql<number>`count(*)` }).from(models).where(eq(models.workspaceId, workspaceId)).get())!.n;
}

async function emptyWorkspace(slug: string): Promise<string> {
  const [w] = await t.db.insert(workspaces).values({ slug, name: "Kestrel Lab" }).returning();
  return w.id;
}

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  const seeded = await seedAtlasPeople(t.db, "kestrel");
  source = seeded.workspace.id;
  userId = seeded.people.curator.id;
  const who = { workspaceId: source, userId };
  // Rule 146 onto rule 128 at block 3 with "the block is 111" (Israeli & Goldenfeld, PRE 73, 026203, 2006).
  const m146 = await submitBuild({ ...who, build: { kind: "projection", rule: 146, block: 3, projection: [0, 0, 0, 0, 0, 0, 0, 1] } });
  await submitBuild({ ...who, build: { kind: "projection", rule: 128, block: 3, projection: [0, 0, 0, 0, 0, 0, 0, 1] } });
  // Rule 90 onto itself by parity at block 2; the chain pastes it twice (block 4).
  const m90 = await submitBuild({ ...who, build: { kind: "projection", rule: 90, block: 2, projection: [0, 1, 1, 0] } });
  const lump = await submitBuild({ ...who, build: { kind: "lumping", chain: OZ, partition: [0, 1, 0] } });
  await submitBuild({ ...who, build: { kind: "decimation", chain: OZ, steps: 2 } });
  await submitChain({ ...who, name: "rule 90 by parity, twice", mapIds: [m90.mapId, m90.mapId] });
  expect(m146.status).toBe("created");
  await retractMap({ workspaceId: source, mapId: lump.mapId, userId, reason: "entered against the wrong chain" });
  const [oz] = await t.db.select().from(models).where(eq(models.states, 3)).limit(1);
  await updateModelDetails({ workspaceId: source, modelId: oz.id, userId, name: "Land of Oz weather", description: "rain, nice, snow" });
  await createSearchRecord({ workspaceId: source, modelId: oz.id, kind: "lumpings", maxBlock: null, algorithm: "partition refinement", algorithmVersion: "1", coverage: { states: 3 }, outcome: { targets: [] } });
  bundleText = JSON.stringify(await exportWorkspaceBundle({ workspaceId: source, workspaceName: "Kestrel Lab" }));
}, 120_000);
afterAll(async () => {
  await closeVerificationPool();
  setDatabase(null);
  t.cleanup();
});

describe("workspace bundle", () => {
  it("exports models, certificates, maps, chains and search records", () => {
    const bundle = WorkspaceBundle.parse(JSON.parse(bundleText));
    expect(bundle.maps).toHaveLength(5);
    expect(bundle.chains).toHaveLength(1);
    expect(bundle.certificates.length).toBe(6); // five maps and the chain's composite
    expect(bundle.searchRecords).toHaveLength(1);
    expect(bundle.models.map((m) => m.name)).toContain("Land of Oz weather");
    expect(bundle.maps.filter((m) => m.status === "retracted").map((m) => m.retractedReason)).toEqual(["entered against the wrong chain"]);
  });

  it("imports into an empty workspace unchanged: the export of the copy equals the original but for the date", async () => {
    const copy = await emptyWorkspace("kestrel-copy");
    const checked = await verifyBundle(WorkspaceBundle.parse(JSON.parse(bundleText)));
    const counts = await importWorkspaceBundle({ workspaceId: copy, userId, checked });
    expect(counts.maps).toBe(5);
    const again = await exportWorkspaceBundle({ workspaceId: copy, workspaceName: "Kestrel Lab" });
    const original = JSON.parse(bundleText) as { exportedAt: string };
    expect({ ...again, exportedAt: original.exportedAt }).toEqual(original);
  }, 120_000);

  it("refuses a bundle with one changed byte in a certificate, naming it, and imports nothing", async () => {
    const target = await emptyWorkspace("kestrel-tampered");
    const original = JSON.parse(bundleText) as { certificates: { address: string; map: { kind: string } }[] };
    const index = original.certificates.findIndex((c) => bundleText.includes(`"rule":146`) && JSON.stringify(c).includes(`"rule":146`));
    const address = original.certificates[index].address;
    const certText = JSON.stringify(original.certificates[index]);
    const tampered = bundleText.replace(certText, certText.replace(`"rule":146`, `"rule":147`));
    expect(tampered.length).toBe(bundleText.length);
    const error = await verifyBundle(WorkspaceBundle.parse(JSON.parse(tampered))).then(
      () => null,
      (e: unknown) => e,
    );
    expect(isAppError(error)).toBe(true);
    expect((error as Error).message).toContain(address);
    expect((error as { field?: string }).field).toBe(`certificates.${index}`);
    expect(await modelCount(target)).toBe(0);
  }, 120_000);

  it("refuses to import into a workspace that already holds models", async () => {
    const checked = await verifyBundle(WorkspaceBundle.parse(JSON.parse(bundleText)));
    const error = await importWorkspaceBundle({ workspaceId: source, userId, checked }).catch((e: unknown) => e);
    expect(isAppError(error) && error.code).toBe("conflict");
    expect((await t.db.select({ n: sql<number>`count(*)` }).from(maps).where(eq(maps.workspaceId, source)).get())!.n).toBe(5);
  }, 120_000);

  it("writes GraphML with one node per model and one directed edge per map", async () => {
    const xml = await exportWorkspaceGraphml({ workspaceId: source, workspaceName: "Kestrel <Lab>" });
    expect(xml.startsWith('<?xml version="1.0" encoding="UTF-8"?>')).toBe(true);
    expect(xml).toContain('<graph id="atlas" edgedefault="directed">');
    expect(xml.match(/<node id="sha256:/g)).toHaveLength(await modelCount(source));
    expect(xml.match(/<edge /g)).toHaveLength(5);
    expect(xml).toContain("Kestrel &lt;Lab&gt;");
  });
});
