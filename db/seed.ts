import { env } from "@/env";
import { createDatabase } from "./client";
import { setDatabase } from "./queries/connection";
import { seedAtlas } from "./seed/atlas";
import { seedPeople } from "./seed/people";

/**
 * `npm run db:seed`: the demo scenario, safe to run again. Later parts of the scenario (the atlas)
 * add their own `seedX(db)` call after the people, who own what they create.
 * Runs under `node --conditions=react-server` so that the query layer's `server-only` guard passes.
 */
export async function seed(url = env.DATABASE_URL): Promise<void> {
  const db = createDatabase(url, env.DATABASE_AUTH_TOKEN);
  setDatabase(db);
  try {
    const { workspace, people } = await seedPeople(db);
    console.log(`seeded ${workspace.name} (${people.length} people) into ${url}`);
    const builder = people.find((p) => p.role === "contributor") ?? people[0];
    await seedAtlas({ db, workspaceId: workspace.id, userId: builder.id });
  } finally {
    setDatabase(null);
    db.$client.close();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  seed().catch((err) => {
    console.error("seeding failed:", err);
    process.exit(1);
  });
}
