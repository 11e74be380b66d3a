import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { setDatabase } from "@/db/queries/connection";
import { listMapsFrom } from "@/db/queries/maps";
import { getModel } from "@/db/queries/models";
import { chains, jobs, maps, searchRecords } from "@/db/schema";
import { canonicalModel, modelAddress } from "@/lib/models";
import { DEMO_CHAINS } from "@/db/seed/chains";
import { DEMO_ECA_ATLAS, seedAtlas } from "@/db/seed/atlas";
import { seedPeople } from "./jobs-fixtures";

let t: TestDatabase;
let ws: string;
let people: Awaited<ReturnType<typeof seedPeople>>["people"];
const lines: string[] = [];

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  ({ workspace: { id: ws }, people } = await seedPeople(t.db));
});

afterAll(() => {
  setDatabase(null);
  t.cleanup();
});

describe("the demo atlas seed", () => {
  it("builds the ECA atlas through a queued job and adds the invented chains with their maps", { timeout: 300_000 }, async () => {
    const { atlasJob } = await seedAtlas({ db: t.db, workspaceId: ws, userId: people.contributor.id, log: (l) => lines.push(l) });
    expect(atlasJob.kind).toBe("eca-atlas");
    expect(atlasJob.params).toEqual(DEMO_ECA_ATLAS);
    expect(atlasJob.status).toBe("succeeded");
    expect(atlasJob.attempts).toBe(1);
    const allJobs = await t.db.select().from(jobs);
    expect(allJobs.map((j) => [j.kind, j.status])).toEqual([["eca-atlas", "succeeded"]]);

    // Every rule has a recorded projection search and a congruence search (negative results included).
    expect(await t.db.select().from(searchRecords)).toHaveLength(512);
    // Rule 146 → rule 128 at block 3: Israeli & Goldenfeld, PRL 92, 074105 (2004) (recalled from memory).
    const r146 = await getModel({ workspaceId: ws, idOrAddress: modelAddress(canonicalModel({ kind: "eca", rule: 146 })) });
    const from146 = await listMapsFrom({ workspaceId: ws, modelId: r146!.id, block: 3, limit: 200 });
    expect(from146.items.some((m) => m.kind === "projection" && m.target.rule === 128)).toBe(true);

    const queue = await getModel({ workspaceId: ws, idOrAddress: modelAddress(canonicalModel(DEMO_CHAINS.twinBayQueue)) });
    const fromQueue = await listMapsFrom({ workspaceId: ws, modelId: queue!.id, limit: 50 });
    expect(fromQueue.items.map((m) => m.kind).sort()).toEqual(["decimation", "lumping"]);
    expect(await t.db.select().from(chains)).toHaveLength(1);
    expect(lines.some((l) => /^ECA atlas: \d+ coarse-grainings certified/.test(l))).toBe(true);
  });

  it("adds nothing when run again", { timeout: 120_000 }, async () => {
    const before = { maps: (await t.db.select().from(maps)).length, jobs: (await t.db.select().from(jobs)).length };
    await seedAtlas({ db: t.db, workspaceId: ws, userId: people.contributor.id, log: () => undefined });
    expect({ maps: (await t.db.select().from(maps)).length, jobs: (await t.db.select().from(jobs)).length }).toEqual(before);
    expect(await t.db.select().from(chains)).toHaveLength(1);
  });
});
