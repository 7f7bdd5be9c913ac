// The floor's write transaction (src/server/platform/db.ts writeTransaction): IMMEDIATE, all or
// nothing, and savepoints for work nested inside it — SQLite's transaction rules
// (https://www.sqlite.org/lang_transaction.html, https://www.sqlite.org/lang_savepoint.html).
import Database from "better-sqlite3";
import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { settings } from "@/db/schema";
import { databaseFile, getDb, getSqlite, writeTransaction } from "@/server/platform/db";

const KEY = "writeTransactionTest";
const value = () => getDb().select().from(settings).where(eq(settings.key, KEY)).get()?.value;
const put = (tx: Parameters<Parameters<typeof writeTransaction>[0]>[0], v: string) =>
  tx.insert(settings).values({ key: KEY, value: v, updatedAt: new Date(), updatedBy: "user-admin" }).onConflictDoUpdate({ target: settings.key, set: { value: v } }).run();

describe("writeTransaction", () => {
  it("holds the write lock from its first statement: another connection cannot begin a write", () => {
    const other = new Database(databaseFile());
    other.pragma("busy_timeout = 0");
    try {
      writeTransaction(() => {
        expect(getSqlite().inTransaction).toBe(true);
        // Nothing written yet, and still the lock is held (BEGIN IMMEDIATE).
        expect(() => other.exec("BEGIN IMMEDIATE")).toThrow(/locked|busy/i);
      });
      other.exec("BEGIN IMMEDIATE; ROLLBACK");
    } finally {
      other.close();
    }
  });

  it("keeps every statement or none", () => {
    writeTransaction((tx) => put(tx, '"kept"'));
    expect(value()).toBe('"kept"');
    expect(() =>
      writeTransaction((tx) => {
        put(tx, '"lost"');
        throw new Error("refused half-way");
      }),
    ).toThrow("refused half-way");
    expect(value()).toBe('"kept"');
    expect(getSqlite().inTransaction).toBe(false);
  });

  it("turns a nested transaction into a savepoint that can fail alone", () => {
    writeTransaction((tx) => {
      put(tx, '"outer"');
      expect(() =>
        tx.transaction((inner) => {
          put(inner, '"inner"');
          throw new Error("inner refused");
        }),
      ).toThrow("inner refused");
      expect(value()).toBe('"outer"');
    });
    expect(value()).toBe('"outer"');
  });
});
