import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { setDatabase } from "@/db/queries/atlas";
import { updateModelDetails } from "@/db/queries/models";
import { models } from "@/db/schema";
import { seedDemoChains } from "@/db/seed/chains";
import { closeVerificationPool } from "@/server/atlas/pool";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { seedAtlasPeople } from "./atlas-fixtures";

let t: TestDatabase;
let ws: string;
let userId: string;

const names = async () => (await t.db.select({ name: models.name }).from(models).where(eq(models.workspaceId, ws)).all()).map((m) => m.name).sort();

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  const seeded = await seedAtlasPeople(t.db, "demo-names");
  ws = seeded.workspace.id;
  userId = seeded.people.contributor.id;
  await seedDemoChains({ workspaceId: ws, userId });
}, 120_000);
afterAll(async () => {
  await closeVerificationPool();
  setDatabase(null);
  t.cleanup();
});

describe("the demo chains' names", () => {
  it("are the scenario's names, not 'Markov chain (n states)'", async () => {
    const all = await names();
    expect(all).toContain("Twin-bay queue");
    expect(all).toContain("Ward compartments");
    expect(all).toContain("Greenhouse sensor");
    expect(all).toContain("Twin-bay queue: parity of busy bays");
    expect(all.filter((n) => n.startsWith("Markov chain ("))).toEqual([]);
  });

  it("are not overwritten by a second seed once a person renamed a model", async () => {
    const [queue] = await t.db.select().from(models).where(and(eq(models.workspaceId, ws), eq(models.name, "Twin-bay queue"))).all();
    await updateModelDetails({ workspaceId: ws, modelId: queue.id, userId, name: "Sample bays (ours)", description: "" });
    await seedDemoChains({ workspaceId: ws, userId });
    const all = await names();
    expect(all).toContain("Sample bays (ours)");
    expect(all).not.toContain("Twin-bay queue");
  }, 120_000);
});
