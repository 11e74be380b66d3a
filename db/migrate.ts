import { migrate } from "drizzle-orm/libsql/migrator";
import { env } from "@/env";
import { createDatabase } from "./client";

/** Applies the committed migrations under drizzle/ to DATABASE_URL (or the URL given). */
export async function migrateDatabase(url = env.DATABASE_URL, authToken = env.DATABASE_AUTH_TOKEN): Promise<void> {
  const db = createDatabase(url, authToken);
  await migrate(db, { migrationsFolder: new URL("../drizzle", import.meta.url).pathname });
  db.$client.close();
}

if (import.meta.url === `file://${process.argv[1]}`) {
  migrateDatabase().then(
    () => console.log(`migrated ${env.DATABASE_URL}`),
    (err) => {
      console.error("migration failed:", err);
      process.exit(1);
    },
  );
}
