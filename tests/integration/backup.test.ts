import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import Database from "better-sqlite3";
import { describe, expect, it } from "vitest";
import { POST as postEvent } from "../../app/api/events/route";
import { backupDatabase } from "@/db/backup";
import { databaseFile, getSqlite } from "@/server/platform/db";
import { call, jsonRequest, signInAs } from "../support/api";

function everyTable(db: Database.Database) {
  const names = (db.prepare("select name from sqlite_master where type = 'table' and name not like 'sqlite_%' order by name").all() as { name: string }[]).map((r) => r.name);
  return Object.fromEntries(names.map((n) => [n, db.prepare(`select * from "${n}" order by rowid`).all()]));
}

describe("online backup and restore", () => {
  it("copies a live database while writes go on, and the copy restores every table", async () => {
    const brewer = await signInAs("brewer@example.com");
    const dir = mkdtempSync(path.join(tmpdir(), "grainline-backup-"));
    const copy = path.join(dir, "backup.db");
    // Writes keep arriving while the backup runs.
    const writes = Array.from({ length: 5 }, () =>
      call(postEvent, jsonRequest("/api/events", { cookie: brewer, body: { step: "measuring", inputs: [{ lot: "P26-0001", quantity: 0 }], measurements: [{ name: "moisturePct", value: 13.2, unit: "%" }] } })),
    );
    const [{ pages }] = await Promise.all([backupDatabase(databaseFile(), copy), ...writes]);
    expect(pages).toBeGreaterThan(10);

    // Restore = open the copy in place of the original; compare every row of every table
    // with the original as it stood when the copy was taken (plus later writes, compared by count).
    const restored = new Database(copy, { readonly: true });
    expect(restored.pragma("integrity_check", { simple: true })).toBe("ok");
    const original = everyTable(getSqlite());
    const back = everyTable(restored);
    expect(Object.keys(back)).toEqual(Object.keys(original));
    for (const table of Object.keys(original)) {
      const rows = back[table]!;
      // Every restored row is a row of the original, in order; nothing restored that never existed.
      expect(original[table]!.slice(0, rows.length), table).toEqual(rows);
    }
    const events = (db: Database.Database) => (db.prepare("select count(*) as n from events").get() as { n: number }).n;
    expect(events(restored)).toBeGreaterThan(50);
    restored.close();
  });
});
