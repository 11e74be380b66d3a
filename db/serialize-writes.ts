import type { Client, InStatement, Transaction } from "@libsql/client";

/**
 * The embedded libSQL client keeps several connections to one file and runs each statement
 * synchronously. While a transaction holds the write lock on one connection and awaits between its
 * statements, a write on another connection blocks the whole thread in SQLite's busy handler, so the
 * transaction can never finish: a self-deadlock that ends in SQLITE_BUSY. This wrapper lets one
 * writer (a transaction, from begin to commit or rollback, or a single write statement) go at a
 * time; other writers wait asynchronously. Plain reads are not queued: they never conflict.
 * The lock belongs to the file (`key`), not to the client, and lives on globalThis, because Next
 * may bundle the server's entry points separately, each with its own client to the same file.
 */
export function serializeWrites(client: Client, options: { key: string; waitMs?: number }): Client {
  const waitMs = options.waitMs ?? 15_000;
  const tails = lockTails();

  async function acquire(): Promise<() => void> {
    let release!: () => void;
    const held = new Promise<void>((resolve) => (release = resolve));
    const previous = tails.get(options.key) ?? Promise.resolve();
    tails.set(options.key, previous.then(() => held));
    let timer: NodeJS.Timeout | undefined;
    const timeout = new Promise<never>((_, reject) => {
      timer = setTimeout(
        () => reject(new Error(`waited ${waitMs} ms for the database write lock (a query on the outer client inside a transaction?)`)),
        waitMs,
      );
    });
    try {
      await Promise.race([previous, timeout]);
    } catch (err) {
      // Give our place up only after the holder ahead of us finishes, so the order stays intact.
      void previous.then(release);
      throw err;
    } finally {
      clearTimeout(timer);
    }
    let released = false;
    return () => {
      if (!released) {
        released = true;
        release();
      }
    };
  }

  async function locked<T>(run: () => Promise<T>): Promise<T> {
    const release = await acquire();
    try {
      return await run();
    } finally {
      release();
    }
  }

  async function transaction(...args: Parameters<Client["transaction"]>): Promise<Transaction> {
    const release = await acquire();
    let tx: Transaction;
    try {
      tx = await client.transaction(...args);
    } catch (err) {
      release();
      throw err;
    }
    const end =
      <K extends "commit" | "rollback">(method: K) =>
      async () => {
        try {
          await tx[method]();
        } finally {
          release();
        }
      };
    return Object.assign(Object.create(tx) as Transaction, {
      execute: tx.execute.bind(tx),
      batch: tx.batch.bind(tx),
      executeMultiple: tx.executeMultiple.bind(tx),
      commit: end("commit"),
      rollback: end("rollback"),
      close: () => {
        try {
          tx.close();
        } finally {
          release();
        }
      },
    });
  }

  return new Proxy(client, {
    get(target, property, receiver) {
      switch (property) {
        case "execute":
          return (stmt: InStatement | string, args?: unknown) => {
            const text = typeof stmt === "string" ? stmt : stmt.sql;
            const run = () => (target.execute as (s: unknown, a?: unknown) => ReturnType<Client["execute"]>)(stmt, args);
            return isRead(text) ? run() : locked(run);
          };
        case "batch":
        case "migrate":
        case "executeMultiple": {
          const method = target[property].bind(target) as (...a: unknown[]) => Promise<unknown>;
          return (...a: unknown[]) => locked(() => method(...a));
        }
        case "transaction":
          return transaction;
        default: {
          const value = Reflect.get(target, property, receiver);
          return typeof value === "function" ? value.bind(target) : value;
        }
      }
    },
  });
}

function lockTails(): Map<string, Promise<void>> {
  const holder = globalThis as { [LOCKS]?: Map<string, Promise<void>> };
  holder[LOCKS] ??= new Map();
  return holder[LOCKS];
}
const LOCKS = Symbol.for("squarely.db.writeLocks");

function isRead(sql: string): boolean {
  return /^\s*select\b/i.test(sql) || (/^\s*with\b/i.test(sql) && !/\b(insert|update|delete|replace)\b/i.test(sql));
}
