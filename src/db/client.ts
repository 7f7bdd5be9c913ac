import Database from "better-sqlite3";
import { drizzle } from "drizzle-orm/better-sqlite3";
import { migrate } from "drizzle-orm/better-sqlite3/migrator";
import type { BaseSQLiteDatabase } from "drizzle-orm/sqlite-core";
import { mkdirSync } from "node:fs";
import path from "node:path";
import * as schema from "./schema";

export type Db = ReturnType<typeof drizzleOver>;
/** A connection or an open transaction: what helpers that join a caller's transaction take. */
export type DbOrTx = BaseSQLiteDatabase<"sync", Database.RunResult, typeof schema>;

/** Opens (creating if needed) the SQLite file with the settings every connection needs. */
export function openDatabase(file: string) {
  if (file !== ":memory:") mkdirSync(path.dirname(path.resolve(file)), { recursive: true });
  const sqlite = new Database(file);
  // WAL lets readers go on while one writer commits; the busy timeout makes a second
  // writer wait for the lock instead of failing at once.
  sqlite.pragma("journal_mode = WAL");
  sqlite.pragma("busy_timeout = 5000");
  sqlite.pragma("foreign_keys = ON");
  sqlite.pragma("synchronous = NORMAL");
  return { sqlite, db: drizzleOver(sqlite) };
}

/** A Drizzle database over an open connection. */
export function drizzleOver(sqlite: Database.Database) {
  return drizzle(sqlite, { schema });
}

export const MIGRATIONS_FOLDER = path.resolve(process.cwd(), "drizzle");

export function migrateDatabase(db: Db, migrationsFolder = MIGRATIONS_FOLDER) {
  migrate(db, { migrationsFolder });
}
