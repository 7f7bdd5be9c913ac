import "server-only";
import { openDatabase, type Db } from "@/db/client";

export const DEFAULT_DB_FILE = "data/grainline.db";

export function databaseFile(): string {
  return process.env.GRAINLINE_DB || DEFAULT_DB_FILE;
}

const globalForDb = globalThis as unknown as { grainlineDb?: ReturnType<typeof openDatabase> };

function connection() {
  globalForDb.grainlineDb ??= openDatabase(databaseFile());
  return globalForDb.grainlineDb;
}

/** The one connection of this process (better-sqlite3 is synchronous; one is enough). */
export function getDb(): Db {
  return connection().db;
}

export function getSqlite() {
  return connection().sqlite;
}
