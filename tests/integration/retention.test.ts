import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { getSqlite } from "@/server/platform/db";

// Rice traceability act (MAFF): transaction records are kept at least three years. Grainline
// keeps them for good: the ledger tables refuse DELETE and UPDATE at the database, and no
// route offers a removal.
const LEDGER = ["events", "event_inputs", "event_outputs", "lineage_edges", "measurements", "attachments", "lot_source_deltas", "supplier_contracts", "supplier_entries", "supplier_statements", "supplier_statement_entries", "receipt_requests", "receipt_outcomes", "lot_holds"];

describe("retention", () => {
  it("refuses to delete any ledger row, however old", () => {
    const sqlite = getSqlite();
    for (const table of LEDGER) {
      const n = (sqlite.prepare(`select count(*) as n from ${table}`).get() as { n: number }).n;
      if (n === 0) continue;
      expect(() => sqlite.prepare(`delete from ${table} where rowid = (select min(rowid) from ${table})`).run(), table).toThrow(/append-only/);
    }
    // The seeded 2024 season is more than a year old and still all there.
    expect((sqlite.prepare("select count(*) as n from events where at < ?").get(Date.parse("2025-01-01")) as { n: number }).n).toBeGreaterThan(50);
  });

  it("offers no DELETE route anywhere in the API", () => {
    const routes: string[] = [];
    const walk = (dir: string) => {
      for (const entry of readdirSync(dir, { withFileTypes: true })) {
        const full = path.join(dir, entry.name);
        if (entry.isDirectory()) walk(full);
        else if (entry.name === "route.ts") routes.push(full);
      }
    };
    walk(path.resolve("app"));
    expect(routes.length).toBeGreaterThan(10);
    for (const file of routes) expect(readFileSync(file, "utf8"), file).not.toMatch(/export\s+(const|async function|function)\s+DELETE\b/);
  });
});
