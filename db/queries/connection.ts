import "server-only";
import { db as appDb, type Database } from "@/db";
import { AppError, isAppError } from "@/server/errors";

/** A database or an open transaction: every query function can run inside a caller's transaction. */
export type Executor = Database | Parameters<Parameters<Database["transaction"]>[0]>[0];

let override: Database | null = null;

/**
 * Points every query at another database (a migrated temporary file). Only tests call this; the
 * app always uses the one client from `@/db`.
 */
export function setDatabase(db: Database | null): void {
  override = db;
}

export function getDatabase(): Database {
  return override ?? appDb;
}

/** Keeps app errors as they are and wraps driver errors in one app error that keeps the cause. */
export function wrapDbError(err: unknown, what: string): AppError {
  if (isAppError(err)) return err;
  console.error(`database error while ${what}:`, err);
  return new AppError("database", `The database could not complete ${what}; nothing was changed.`, { cause: err });
}

export async function withDb<T>(what: string, run: () => Promise<T>): Promise<T> {
  try {
    return await run();
  } catch (err) {
    throw wrapDbError(err, what);
  }
}

/** SQLite reports a unique-index violation with this text whatever the driver. */
export function isUniqueViolation(err: unknown): boolean {
  for (let e: unknown = err; e; e = (e as { cause?: unknown }).cause) {
    if (String((e as { message?: unknown }).message ?? "").includes("UNIQUE constraint failed")) return true;
  }
  return false;
}
