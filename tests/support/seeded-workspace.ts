import { afterAll, beforeAll } from "vitest";
import { setSessionReader } from "@/app/api/_lib/actor";
import type { Database } from "@/db/client";
import { setDatabase } from "@/db/queries/connection";
import { seedAtlasPeople } from "@/tests/integration/atlas-fixtures";
import { createTestDatabase, type TestDatabase } from "./database";

type Session = { id: string; email: string; name: string } | null;
type People = Awaited<ReturnType<typeof seedAtlasPeople>>["people"];

export type SeededWorkspace = {
  readonly db: Database;
  /** One member per role. */
  readonly people: People;
  /** The workspace's id. */
  readonly ws: string;
  /** Whom the route handlers see as signed in from now on (nobody at first). */
  signIn: (who: Session) => void;
};

/**
 * For a test file: before its tests, a migrated temporary database installed as the query layer's,
 * holding the workspace `slug` with one member per role (`seedAtlasPeople`), and route handlers that
 * read the session `signIn` last named; after them, all of it undone. Call it at the top of the file.
 */
export function useSeededWorkspace(slug: string): SeededWorkspace {
  let t: TestDatabase | undefined;
  let seeded: Awaited<ReturnType<typeof seedAtlasPeople>> | undefined;
  let session: Session = null;
  beforeAll(async () => {
    t = await createTestDatabase();
    setDatabase(t.db);
    seeded = await seedAtlasPeople(t.db, slug);
    setSessionReader(async () => session);
  });
  afterAll(() => {
    setSessionReader(null);
    setDatabase(null);
    t?.cleanup();
  });
  const ready = () => {
    if (!t || !seeded) throw new Error("the seeded workspace is made in beforeAll: use it inside a test or hook");
    return { db: t.db, seeded };
  };
  return {
    get db() {
      return ready().db;
    },
    get people() {
      return ready().seeded.people;
    },
    get ws() {
      return ready().seeded.workspace.id;
    },
    signIn: (who) => {
      session = who;
    },
  };
}
