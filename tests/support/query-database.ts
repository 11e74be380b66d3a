import { afterAll, beforeAll } from "vitest";
import { setDatabase } from "@/db/queries/connection";
import { createTestDatabase, type TestDatabase } from "./database";

/**
 * For a test file of the query layer: a migrated temporary database that the query functions use for
 * the whole file, closed and deleted after it. Call the returned function inside tests.
 */
export function useQueryLayerDatabase(): () => TestDatabase {
  let t: TestDatabase | undefined;
  beforeAll(async () => {
    t = await createTestDatabase();
    setDatabase(t.db);
  }, 60_000);
  afterAll(() => {
    setDatabase(null);
    t?.cleanup();
  });
  return () => {
    if (!t) throw new Error("the test database is opened in beforeAll; read it inside a test");
    return t;
  };
}
