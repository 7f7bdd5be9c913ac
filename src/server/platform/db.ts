import "server-only";
import type Database from "better-sqlite3";
import { drizzleOver, openDatabase, type Db, type DbOrTx } from "@/db/client";

export const DEFAULT_DB_FILE = "data/grainline.db";

export function databaseFile(): string {
  return process.env.GRAINLINE_DB || DEFAULT_DB_FILE;
}

const globalForDb = globalThis as unknown as { grainlineDb?: { sqlite: Database.Database } };

/**
 * The one SQLite connection of this process is kept on globalThis (it outlives Next's module
 * reloads in development, and src/cli/serve.ts shares it with Next for the WAL checkpointer). Each
 * copy of this module wraps it in a Drizzle of its own: Next's bundle and the server's own modules
 * load separate copies of Drizzle, and a Drizzle serving another copy's tables takes its slow paths.
 */
type Work = (tx: DbOrTx) => unknown;
let local: { sqlite: Database.Database; db: Db; write: Database.Transaction<(work: Work, db: Db) => unknown> } | undefined;

function connection() {
  globalForDb.grainlineDb ??= openDatabase(databaseFile());
  const { sqlite } = globalForDb.grainlineDb;
  if (local?.sqlite !== sqlite) local = { sqlite, db: drizzleOver(sqlite), write: sqlite.transaction((work: Work, db: Db) => work(db)) };
  return local;
}

/** This module copy's Drizzle over the process's one connection (better-sqlite3 is synchronous; one is enough). */
export function getDb(): Db {
  return connection().db;
}

export function getSqlite() {
  return connection().sqlite;
}

/**
 * Runs `work` in one IMMEDIATE transaction: the write lock is taken up front, so two writers
 * are served one after the other. The same as Drizzle's `transaction(work, { behavior:
 * "immediate" })`, whose every call builds a transaction object with a query builder per
 * table and a new better-sqlite3 wrapper; this one is built once per connection, and `work`
 * runs its statements on the connection's own Drizzle, inside the open transaction (a
 * nested `transaction` there becomes a savepoint). The floor's writes go through here.
 */
export function writeTransaction<T>(work: (tx: DbOrTx) => T): T {
  const { db, write } = connection();
  return write.immediate(work, db) as T;
}
