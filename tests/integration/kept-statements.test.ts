// The connection keeps prepared statements by their text (src/db/client.ts): the same query is
// compiled once, a statement Drizzle switched to arrays comes back giving objects, and the
// number kept stays bounded.
import { describe, expect, it } from "vitest";
import { openDatabase } from "@/db/client";

describe("kept statements", () => {
  const { sqlite } = openDatabase(":memory:");
  sqlite.exec("create table t (id integer primary key, name text); insert into t (name) values ('koji'), ('moromi')");

  it("compiles a query once and hands the same statement out again", () => {
    expect(sqlite.prepare("select name from t order by id")).toBe(sqlite.prepare("select name from t order by id"));
    expect(sqlite.prepare("select name from t order by id")).not.toBe(sqlite.prepare("select name from t order by id desc"));
  });

  it("hands a statement out in its default mode after someone read arrays from it", () => {
    expect(sqlite.prepare("select id, name from t order by id").raw().all()).toEqual([[1, "koji"], [2, "moromi"]]);
    expect(sqlite.prepare("select id, name from t order by id").all()).toEqual([{ id: 1, name: "koji" }, { id: 2, name: "moromi" }]);
    // Statements that return nothing have no mode to reset, and still run.
    expect(sqlite.prepare("update t set name = name where id = ?").run(1).changes).toBe(1);
  });

  it("keeps at most 1,000, dropping the least recently used", () => {
    const first = sqlite.prepare("select 0 as n");
    for (let n = 1; n <= 1_000; n++) sqlite.prepare(`select ${n} as n`);
    expect(sqlite.prepare("select 1000 as n")).toBe(sqlite.prepare("select 1000 as n"));
    expect(sqlite.prepare("select 0 as n"), "the oldest was let go and is compiled anew").not.toBe(first);
    expect(sqlite.prepare("select 0 as n").get()).toEqual({ n: 0 });
  });
});
