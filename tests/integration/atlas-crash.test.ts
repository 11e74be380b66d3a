import { eq, sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { auditEvents, certificates, maps, models } from "@/db/schema";
import { setDatabase } from "@/db/queries/connection";
import { closeVerificationPool } from "@/server/atlas/pool";
import { submitBuild } from "@/server/atlas/submit";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { startNode } from "@/tests/support/cluster";
import { lumpableBuild } from "@/tests/support/lumpable-build";
import { seedPeople } from "./jobs-fixtures";

const PAUSE_AT = 6;

let t: TestDatabase;

beforeAll(async () => {
  t = await createTestDatabase();
});

afterAll(async () => {
  await closeVerificationPool();
  setDatabase(null);
  t.cleanup();
});

describe("kill -9 of an app process in the middle of a certified write", () => {
  it("leaves a sound database with nothing half-written, and the same submission succeeds on retry", async () => {
    const { workspace, people } = await seedPeople(t.db);
    const writer = await startNode("writer", {
      DATABASE_URL: t.url,
      WRITER_WORKSPACE: workspace.id,
      WRITER_USER: people.contributor.id,
      WRITER_PAUSE_AT: String(PAUSE_AT),
    });
    await writer.waitForLine(new RegExp(`^inside ${PAUSE_AT}$`, "m"), 120_000);
    // The certificate, both models and the map row are written inside the open transaction.
    await writer.killHard();
    expect(writer.output()).toMatch(new RegExp(`^ok ${PAUSE_AT - 1} created$`, "m"));
    expect(writer.output()).not.toMatch(new RegExp(`^ok ${PAUSE_AT} `, "m"));

    const [integrity] = await t.db.all<{ integrity_check: string }>(sql`PRAGMA integrity_check`);
    expect(integrity.integrity_check).toBe("ok");
    expect(await t.db.all(sql`PRAGMA foreign_key_check`)).toEqual([]);

    // Exactly the writes that finished before the kill: each one whole, the interrupted one absent.
    const count = async (table: typeof maps | typeof certificates | typeof models) => (await t.db.select().from(table)).length;
    expect(await count(maps)).toBe(PAUSE_AT);
    expect(await count(certificates)).toBe(PAUSE_AT);
    expect(await count(models)).toBe(2 * PAUSE_AT);
    expect(await t.db.select().from(auditEvents).where(eq(auditEvents.action, "map:create"))).toHaveLength(PAUSE_AT);

    setDatabase(t.db);
    const retried = await submitBuild({ workspaceId: workspace.id, userId: people.contributor.id, build: lumpableBuild(PAUSE_AT) });
    expect(retried.status).toBe("created");
    const again = await submitBuild({ workspaceId: workspace.id, userId: people.contributor.id, build: lumpableBuild(0) });
    expect(again.status).toBe("existing");
    expect(await count(maps)).toBe(PAUSE_AT + 1);
    expect(await count(certificates)).toBe(PAUSE_AT + 1);
  });
});
