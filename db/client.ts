import { createClient } from "@libsql/client";
import { drizzle } from "drizzle-orm/libsql";
import { mkdirSync } from "node:fs";
import { dirname } from "node:path";
import * as schema from "./schema";
import { serializeWrites } from "./serialize-writes";

export type Database = ReturnType<typeof createDatabase>;

/**
 * Opens a database by URL: `file:` for the embedded default, `libsql://` or `http(s)://` for a
 * libSQL server. Tests open their own temporary file with this; the app uses the one in `index.ts`.
 */
export function createDatabase(url: string, authToken?: string) {
  if (url.startsWith("file:")) {
    const path = url.slice("file:".length);
    if (path && path !== ":memory:") mkdirSync(dirname(path), { recursive: true });
  }
  // Several connections of one process share a file (a transaction holds its own), so a writer
  // waits for the lock instead of failing at once with SQLITE_BUSY; remote servers ignore this.
  const opened = createClient({ url, authToken, timeout: 5000 });
  const client = url.startsWith("file:") ? serializeWrites(opened, { key: url }) : opened;
  const db = drizzle(client, { schema });
  return Object.assign(db, { $client: client });
}
