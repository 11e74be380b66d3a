import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { createDatabase, type Database } from "@/db/client";
import { migrateDatabase } from "@/db/migrate";

export type TestDatabase = { db: Database; url: string; dir: string; cleanup: () => void };

/** A migrated libSQL database in a fresh temporary file; `cleanup` closes it and deletes the file. */
export async function createTestDatabase(): Promise<TestDatabase> {
  const dir = mkdtempSync(join(tmpdir(), "squarely-db-"));
  const url = `file:${join(dir, "test.db")}`;
  await migrateDatabase(url);
  const db = createDatabase(url);
  return {
    db,
    url,
    dir,
    cleanup: () => {
      db.$client.close();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
