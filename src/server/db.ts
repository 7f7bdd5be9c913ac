import "server-only";
import type Database from "better-sqlite3";
import { drizzleOver, openDatabase, type Db } from "@/db/client";

export const DEFAULT_DB_FILE = "data/grainline.db";

export function databaseFile(): string {
  return process.env.GRAINLINE_DB || DEFAULT_DB_FILE;
}

const globalForDb = globalThis as unknown as { grainlineDb?: { sqlite: Database.Database } };

/**
 * The one SQLite connection of this process is kept on globalThis (it outlives Next's module
 * reloads in development, and the production server's fast path shares it with Next). Each
 * copy of this module wraps it in a Drizzle of its own: Next's bundle and the fast path load
 * separate copies of Drizzle, and a Drizzle serving another copy's tables takes its slow paths.
 */
let local: { sqlite: Database.Database; db: Db } | undefined;

function connection() {
  globalForDb.grainlineDb ??= openDatabase(databaseFile());
  const { sqlite } = globalForDb.grainlineDb;
  if (local?.sqlite !== sqlite) local = { sqlite, db: drizzleOver(sqlite) };
  return local;
}

/** This module copy's Drizzle over the process's one connection (better-sqlite3 is synchronous; one is enough). */
export function getDb(): Db {
  return connection().db;
}

export function getSqlite() {
  return connection().sqlite;
}
