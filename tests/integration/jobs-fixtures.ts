import { memberships, users, workspaces } from "@/db/schema";
import type { Database } from "@/db/client";
import type { Role } from "@/lib/policy";
import { setDatabase } from "@/db/queries/connection";
import { closeVerificationPool } from "@/server/atlas/pool";
import { createInProcessQueue } from "@/server/jobs/in-process-queue";
import { createJobRunner, type JobRunner } from "@/server/jobs/job-runner";
import type { JobQueue } from "@/server/jobs/queue";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";

/** A workspace with one member per role, inserted directly (the job tests need owners, not sign-in). */
export async function seedPeople(db: Database) {
  const [ws] = await db.insert(workspaces).values({ slug: "queue-lab", name: "Queue lab" }).returning();
  const people = {} as Record<Role | "otherContributor", { id: string; email: string; role: Role }>;
  const roles: [keyof typeof people, Role][] = [
    ["viewer", "viewer"],
    ["contributor", "contributor"],
    ["otherContributor", "contributor"],
    ["curator", "curator"],
    ["admin", "admin"],
  ];
  for (const [key, role] of roles) {
    const email = `${key.toLowerCase()}@queue-lab.test`;
    const [user] = await db.insert(users).values({ email, name: key }).returning();
    await db.insert(memberships).values({ workspaceId: ws.id, userId: user.id, role });
    people[key] = { id: user.id, email, role };
  }
  return { workspace: ws, people };
}

export async function waitFor<T>(probe: () => Promise<T>, accept: (value: T) => boolean, timeoutMs = 20_000): Promise<T> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const value = await probe();
    if (accept(value)) return value;
    if (Date.now() > until) throw new Error(`condition not reached within ${timeoutMs} ms; last value: ${JSON.stringify(value)}`);
    await new Promise((r) => setTimeout(r, 25));
  }
}

export type People = Awaited<ReturnType<typeof seedPeople>>["people"];

/** What a test of the real job kinds works with: a migrated temporary database, its people, a queue and a runner. */
export interface JobKindTestbed {
  t: TestDatabase;
  queue: JobQueue;
  runner: JobRunner;
  ws: string;
  people: People;
}

/**
 * Opens a testbed for the registered job kinds, with the query layer pointed at its database.
 * One worker, so that a test's jobs run in the order it queued them.
 */
export async function openJobKindTestbed(): Promise<JobKindTestbed> {
  await import("@/server/jobs/kinds");
  const t = await createTestDatabase();
  setDatabase(t.db);
  const { workspace, people } = await seedPeople(t.db);
  const queue = createInProcessQueue({ db: t.db, perUserLimit: 4 });
  const runner = createJobRunner({ db: t.db, workers: 1, pollMs: 100 });
  return { t, queue, runner, ws: workspace.id, people };
}

export async function closeJobKindTestbed({ t, runner }: Pick<JobKindTestbed, "t" | "runner">): Promise<void> {
  await runner.stop();
  await closeVerificationPool();
  setDatabase(null);
  t.cleanup();
}
