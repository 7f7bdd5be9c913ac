import "server-only";
import type Database from "better-sqlite3";
import { sql } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";

const byConnection = new WeakMap<Database.Database, Map<string, unknown>>();

/**
 * The better-sqlite3 connection under a Drizzle database or transaction. Drizzle keeps it on
 * its session without a public accessor; tests/integration/prepared.test.ts checks that this
 * still finds it, so an upgrade that moves it fails there and not in production.
 */
export function connectionOf(db: DbOrTx): Database.Database | undefined {
  return (db as unknown as { session?: { client?: Database.Database } }).session?.client;
}

/**
 * A statement built once per connection and kept by name, for the queries every floor request
 * runs: building a Drizzle query takes longer than SQLite takes to run it (`npm run
 * bench:load`). A prepared statement runs inside whatever transaction is open on its
 * connection, so one built on a transaction serves later calls outside it too.
 */
export function prepared<T>(db: DbOrTx, name: string, build: (db: DbOrTx) => T): T {
  const connection = connectionOf(db);
  if (!connection) return build(db);
  let statements = byConnection.get(connection);
  if (!statements) byConnection.set(connection, (statements = new Map()));
  let statement = statements.get(name) as T | undefined;
  if (statement === undefined) {
    statement = build(db);
    statements.set(name, statement);
  }
  return statement;
}

/**
 * `{ field: sql.placeholder("field") }` for each field: the values of a prepared insert, to be
 * filled by name when it runs. Typed as the row it stands for, as Drizzle's `values` expects.
 */
export function placeholdersFor<Row>(fields: readonly (keyof Row & string)[]): Row {
  return Object.fromEntries(fields.map((f) => [f, sql.placeholder(f)])) as Row;
}
