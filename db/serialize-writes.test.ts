import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { workspaces } from "./schema";

let t: TestDatabase;
beforeAll(async () => {
  t = await createTestDatabase();
});
afterAll(() => t.cleanup());

describe("writes on the embedded file are serialized", () => {
  it("lets a write wait for an open transaction instead of deadlocking into SQLITE_BUSY", async () => {
    let outsideDoneAt = 0;
    let txDoneAt = 0;
    const tx = t.db.transaction(async (tx) => {
      await tx.insert(workspaces).values({ slug: "inside-1", name: "Inside 1" });
      await new Promise((r) => setTimeout(r, 150));
      await tx.insert(workspaces).values({ slug: "inside-2", name: "Inside 2" });
      txDoneAt = Date.now();
    });
    await new Promise((r) => setTimeout(r, 20));
    const started = Date.now();
    const outside = t.db
      .insert(workspaces)
      .values({ slug: "outside", name: "Outside" })
      .then(() => (outsideDoneAt = Date.now()));
    // A read during the transaction is answered at once (it never takes the write lock).
    const rows = await t.db.select().from(workspaces);
    expect(Date.now() - started).toBeLessThan(100);
    expect(rows.map((r) => r.slug)).not.toContain("inside-1");
    await Promise.all([tx, outside]);
    expect(outsideDoneAt).toBeGreaterThanOrEqual(txDoneAt);
    const slugs = (await t.db.select().from(workspaces)).map((r) => r.slug).sort();
    expect(slugs).toEqual(["inside-1", "inside-2", "outside"]);
  });

  it("releases the lock after a rolled-back transaction", async () => {
    await expect(
      t.db.transaction(async (tx) => {
        await tx.insert(workspaces).values({ slug: "rolled-back", name: "Rolled back" });
        throw new Error("boom");
      }),
    ).rejects.toThrow("boom");
    await t.db.insert(workspaces).values({ slug: "after", name: "After" });
    const slugs = (await t.db.select().from(workspaces)).map((r) => r.slug);
    expect(slugs).toContain("after");
    expect(slugs).not.toContain("rolled-back");
  });
});
