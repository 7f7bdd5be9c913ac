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
  keepStatements(sqlite);
  return { sqlite, db: drizzleOver(sqlite) };
}

/** Statements kept per connection; a page runs a few dozen distinct ones, the whole app a few hundred. */
const KEPT_STATEMENTS = 1_000;

/**
 * Drizzle prepares every query it runs, and SQLite compiles it again each time: a page spent
 * more time preparing its statements than running some of them. The connection keeps the
 * latest statements by their text instead (a statement is re-usable once it has run; nothing
 * here iterates one lazily). Drizzle switches a statement to arrays with `raw()` when it maps
 * the columns itself, so a kept statement is handed out in its default mode again.
 */
function keepStatements(sqlite: Database.Database) {
  const compile = sqlite.prepare.bind(sqlite);
  const kept = new Map<string, Database.Statement>();
  sqlite.prepare = ((source: string) => {
    let statement = kept.get(source);
    if (statement) kept.delete(source);
    else statement = compile(source);
    kept.set(source, statement);
    if (kept.size > KEPT_STATEMENTS) kept.delete(kept.keys().next().value!);
    if (statement.reader) statement.raw(false);
    return statement;
  }) as typeof sqlite.prepare;
}

/** A Drizzle database over an open connection. */
export function drizzleOver(sqlite: Database.Database) {
  return drizzle(sqlite, { schema });
}

export const MIGRATIONS_FOLDER = path.resolve(process.cwd(), "drizzle");

export function migrateDatabase(db: Db, migrationsFolder = MIGRATIONS_FOLDER) {
  migrate(db, { migrationsFolder });
}
