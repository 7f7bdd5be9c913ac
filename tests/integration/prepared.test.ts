// Statements prepared once per connection (src/server/platform/prepared.ts) must stay on the connection
// they were made for: the seed and the backup restore hand their own connection to the same
// ledger code that serves requests on the app's.
import { eq, sql } from "drizzle-orm";
import { afterAll, describe, expect, it } from "vitest";
import { migrateDatabase, openDatabase } from "@/db/client";
import { lots } from "@/db/schema";
import { lotByCode } from "@/server/ledger/events";
import { getDb, getSqlite } from "@/server/platform/db";
import { connectionOf, prepared } from "@/server/platform/prepared";

const other = openDatabase(":memory:");
migrateDatabase(other.db);
afterAll(() => other.sqlite.close());

describe("prepared statements", () => {
  it("finds the better-sqlite3 connection under a Drizzle database and under its transactions", () => {
    expect(connectionOf(getDb())).toBe(getSqlite());
    getDb().transaction((tx) => expect(connectionOf(tx)).toBe(getSqlite()));
    expect(connectionOf(other.db)).toBe(other.sqlite);
    other.db.transaction((tx) => expect(connectionOf(tx)).toBe(other.sqlite));
  });

  it("keeps one statement per name and connection", () => {
    const build = (db: Parameters<Parameters<typeof prepared>[2]>[0]) => db.select({ n: sql<number>`count(*)` }).from(lots).prepare();
    const a = prepared(getDb(), "test-count", build);
    expect(prepared(getDb(), "test-count", build)).toBe(a);
    getDb().transaction((tx) => expect(prepared(tx, "test-count", build)).toBe(a));
    const b = prepared(other.db, "test-count", build);
    expect(b).not.toBe(a);
    expect(a.get()!.n).toBeGreaterThan(0); // the seeded demo
    expect(b.get()!.n).toBe(0); // an empty database
  });

  it("a lookup through another connection reads that connection's rows, before and after the app's", () => {
    expect(lotByCode(other.db, "P26-0001")).toBeUndefined();
    expect(lotByCode(getDb(), "P26-0001")?.code).toBe("P26-0001");
    expect(lotByCode(other.db, "P26-0001")).toBeUndefined();
    const appRow = getDb().select().from(lots).where(eq(lots.code, "P26-0001")).get()!;
    expect(lotByCode(getDb(), "P26-0001")).toEqual(appRow);
  });
});
