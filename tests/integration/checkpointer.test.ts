import { mkdtempSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import type Database from "better-sqlite3";
import { afterEach, describe, expect, it } from "vitest";
import { openDatabase } from "@/db/client";
import { startCheckpointer, WAL_BOUND_PAGES, type Checkpointer } from "@/server/platform/checkpointer";

// SQLite's write-ahead log (https://www.sqlite.org/wal.html): a commit appends pages to the
// -wal file; a checkpoint copies them into the database file; once a checkpoint has caught up,
// the next writer starts the log again from its beginning, so the file stops growing.

const PAGE = 4096;
const open: { sqlite: Database.Database; checkpointer?: Checkpointer }[] = [];

function scratchDatabase() {
  const file = path.join(mkdtempSync(path.join(tmpdir(), "grainline-wal-")), "scratch.db");
  const { sqlite } = openDatabase(file);
  sqlite.exec("create table t (id integer primary key, payload blob not null)");
  const entry: (typeof open)[number] = { sqlite };
  open.push(entry);
  return { file, sqlite, entry };
}

/** Commits `pages` pages of new rows, one transaction each of about `perCommit` pages. */
function writePages(sqlite: Database.Database, pages: number, perCommit = 4) {
  const insert = sqlite.prepare("insert into t (payload) values (?)");
  const commit = sqlite.transaction(() => {
    for (let i = 0; i < perCommit; i++) insert.run(Buffer.alloc(PAGE - 200, i));
  });
  for (let written = 0; written < pages; written += perCommit) commit();
}

const size = (file: string) => statSync(file).size;

afterEach(async () => {
  for (const { sqlite, checkpointer } of open.splice(0)) {
    await checkpointer?.stop();
    sqlite.close();
  }
});

describe("background WAL checkpoints", () => {
  it("copies committed pages into the database file without the writing connection", async () => {
    const { file, sqlite, entry } = scratchDatabase();
    entry.checkpointer = startCheckpointer(sqlite, { intervalMs: 20 });
    await entry.checkpointer.nextPass();
    const before = size(file);
    writePages(sqlite, 200);
    // The worker runs on its own thread: while this one is busy, its passes catch up with the
    // first 200 pages and their reports queue here. Waiting must not take one of those.
    const busyUntil = Date.now() + 100;
    while (Date.now() < busyUntil);
    writePages(sqlite, 200);
    // Far below the bound: the writing connection has not checkpointed anything itself.
    expect(400).toBeLessThan(WAL_BOUND_PAGES);
    let pass = await entry.checkpointer.nextPass();
    while (pass.checkpointed < pass.log) pass = await entry.checkpointer.nextPass();
    // The rows are in the database file itself now: it grew by at least the pages written.
    expect(size(file) - before).toBeGreaterThanOrEqual(400 * PAGE * 0.9);
  });

  it("keeps the log bounded under writes that never pause", () => {
    const { file, sqlite, entry } = scratchDatabase();
    // A worker that never gets a turn: only the bound checkpoints.
    entry.checkpointer = startCheckpointer(sqlite, { intervalMs: 3_600_000, boundPages: 200 });
    writePages(sqlite, 2_000);
    // Each frame is a page plus a 24-byte header; the log restarts once it passes 200 pages.
    const frame = PAGE + 24;
    expect(size(`${file}-wal`)).toBeLessThanOrEqual(32 + (200 + 8) * frame);
    expect((sqlite.prepare("select count(*) as n from t").get() as { n: number }).n).toBe(2_000);
  });

  it("hands checkpoints back to SQLite when stopped", async () => {
    const { sqlite, entry } = scratchDatabase();
    const checkpointer = startCheckpointer(sqlite);
    expect(sqlite.pragma("wal_autocheckpoint", { simple: true })).toBe(WAL_BOUND_PAGES);
    await checkpointer.stop();
    expect(sqlite.pragma("wal_autocheckpoint", { simple: true })).toBe(1000);
    entry.checkpointer = undefined;
  });

  it("refuses an in-memory database, which has no log", () => {
    const { sqlite } = openDatabase(":memory:");
    expect(() => startCheckpointer(sqlite)).toThrow(/in-memory/);
    sqlite.close();
  });
});
