import "server-only";
import { env } from "@/env";
import { createDatabase, type Database } from "./client";

// One client per process; the dev server's module reloads reuse it through globalThis.
const globalForDb = globalThis as unknown as { squarelyDb?: Database };

export const db: Database = globalForDb.squarelyDb ?? createDatabase(env.DATABASE_URL, env.DATABASE_AUTH_TOKEN);
if (env.NODE_ENV !== "production") globalForDb.squarelyDb = db;

export type { Database } from "./client";
