import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { searchAtlas, setDatabase, upsertModel } from "@/db/queries/atlas";
import { listModels, updateModelDetails } from "@/db/queries/models";
import { auditEvents } from "@/db/schema";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { ecaFields, seedAtlasPeople } from "./atlas-fixtures";

let t: TestDatabase;
let ws: string;
let userId: string;
let chainId: string;

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  const seeded = await seedAtlasPeople(t.db, "names-lab");
  ws = seeded.workspace.id;
  userId = seeded.people.contributor.id;
  for (const rule of [100, 2, 10, 30]) await upsertModel({ workspaceId: ws, model: ecaFields(rule) });
  const chain = await upsertModel({
    workspaceId: ws,
    model: { address: "sha256:" + "c".repeat(64), kind: "markov", name: "Markov chain (4 states)", canonical: "{}", states: 4 },
  });
  chainId = chain.model.id;
  await upsertModel({ workspaceId: ws, model: { address: "sha256:" + "a".repeat(64), kind: "markov", name: "A chain", canonical: "{}", states: 2 } });
});
afterAll(() => t.cleanup());

describe("model order", () => {
  it("lists ECAs by rule number, not as text (2, 10, 30, 100), then the other models by name", async () => {
    const { items } = await listModels({ workspaceId: ws });
    expect(items.map((m) => m.name)).toEqual(["ECA 2", "ECA 10", "ECA 30", "ECA 100", "A chain", "Markov chain (4 states)"]);
  });

  it("pages through the same order one model at a time", async () => {
    const names: string[] = [];
    let cursor: string | null = null;
    do {
      const page: Awaited<ReturnType<typeof listModels>> = await listModels({ workspaceId: ws, limit: 1, cursor });
      names.push(...page.items.map((m) => m.name));
      cursor = page.nextCursor;
    } while (cursor);
    expect(names).toEqual(["ECA 2", "ECA 10", "ECA 30", "ECA 100", "A chain", "Markov chain (4 states)"]);
  });

  it("searches in the same order, page by page", async () => {
    const first = await searchAtlas({ workspaceId: ws, target: "models", modelKind: "eca", limit: 2 });
    expect(first.items.map((m) => (m as { name: string }).name)).toEqual(["ECA 2", "ECA 10"]);
    const second = await searchAtlas({ workspaceId: ws, target: "models", modelKind: "eca", limit: 2, cursor: first.nextCursor });
    expect(second.items.map((m) => (m as { name: string }).name)).toEqual(["ECA 30", "ECA 100"]);
  });
});

describe("updateModelDetails", () => {
  it("renames a model and describes it; search finds it by either", async () => {
    const updated = await updateModelDetails({ workspaceId: ws, modelId: chainId, userId, name: "Twin-bay queue", description: "two identical sample bays" });
    expect(updated?.name).toBe("Twin-bay queue");
    const byName = await searchAtlas({ workspaceId: ws, target: "models", q: "twin-bay" });
    expect(byName.items.map((m) => m.id)).toEqual([chainId]);
    const byDescription = await searchAtlas({ workspaceId: ws, target: "models", q: "sample bays" });
    expect(byDescription.items.map((m) => m.id)).toEqual([chainId]);
  });

  it("records who renamed it, with the name before and after", async () => {
    const events = await t.db.select().from(auditEvents).where(eq(auditEvents.subjectId, chainId)).all();
    const rename = events.find((e) => e.action === "model:rename");
    expect(rename?.actorId).toBe(userId);
    expect(JSON.parse(rename!.detail)).toMatchObject({ before: { name: "Markov chain (4 states)" }, after: { name: "Twin-bay queue" } });
  });

  it("changes nothing for a model of another workspace", async () => {
    const other = await seedAtlasPeople(t.db, "other-lab");
    expect(await updateModelDetails({ workspaceId: other.workspace.id, modelId: chainId, userId, name: "x", description: "" })).toBeNull();
    const { items } = await listModels({ workspaceId: ws, kind: "markov" });
    expect(items.map((m) => m.name)).toContain("Twin-bay queue");
  });
});
