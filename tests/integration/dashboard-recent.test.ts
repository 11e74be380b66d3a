import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { setDatabase } from "@/db/queries/connection";
import { createCertifiedEdge, retractMap } from "@/db/queries/maps";
import { countConstantTargetMaps, listRecentMaps } from "@/db/queries/workspaces";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { edgeInput, seedAtlasPeople } from "./atlas-fixtures";

let t: TestDatabase;
let ws: string;
let author: string;

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  const seeded = await seedAtlasPeople(t.db, "dash-lab");
  ws = seeded.workspace.id;
  author = seeded.people.contributor.id;
});

afterAll(() => {
  setDatabase(null);
  t.cleanup();
});

const summaries = (rows: { summary: string }[]) => rows.map((r) => r.summary).sort();

describe("the dashboard's recently certified maps", () => {
  it("folds the maps onto the constant rules 0 and 255 apart from the others, and counts them", async () => {
    // Five maps onto constant rules, as a seed's atlas job makes them, and three others.
    for (const [from, to] of [[30, 0], [45, 255], [90, 0], [150, 255], [110, 0]]) await createCertifiedEdge(edgeInput(ws, author, from, to, 2));
    for (const [from, to] of [[146, 128], [105, 150], [23, 232]]) await createCertifiedEdge(edgeInput(ws, author, from, to, 2));
    // A retracted map onto a constant rule is neither listed nor counted.
    const retracted = await createCertifiedEdge(edgeInput(ws, author, 60, 0, 3));
    await retractMap({ workspaceId: ws, mapId: retracted.mapId, userId: author, reason: "a test of the count" });

    expect(summaries(await listRecentMaps({ workspaceId: ws, limit: 6, constantTargets: "exclude" }))).toEqual([
      "ECA 105 → ECA 150 at block 2",
      "ECA 146 → ECA 128 at block 2",
      "ECA 23 → ECA 232 at block 2",
    ]);
    expect(await countConstantTargetMaps({ workspaceId: ws })).toBe(5);
    const constant = await listRecentMaps({ workspaceId: ws, limit: 3, constantTargets: "only" });
    expect(constant).toHaveLength(3);
    expect(constant.every((m) => m.targetName === "ECA 0" || m.targetName === "ECA 255")).toBe(true);
    // Without the option the list is as before: every certified map, constant targets included.
    expect(await listRecentMaps({ workspaceId: ws, limit: 20 })).toHaveLength(8);
  });

  it("counts nothing in a workspace without maps onto constant rules", async () => {
    const other = await seedAtlasPeople(t.db, "dash-empty");
    await createCertifiedEdge(edgeInput(other.workspace.id, other.people.contributor.id, 146, 128, 3));
    expect(await countConstantTargetMaps({ workspaceId: other.workspace.id })).toBe(0);
    expect(await listRecentMaps({ workspaceId: other.workspace.id, constantTargets: "only" })).toEqual([]);
  });
});
