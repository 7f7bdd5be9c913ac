// Every test file gets its own SQLite file with the committed migrations applied and
// the demo scenario seeded, so files can run in parallel without seeing each other.
import { mkdirSync, rmSync } from "node:fs";
import path from "node:path";
import { afterAll, beforeAll } from "vitest";
import { migrateDatabase, openDatabase } from "@/db/client";
import { seedDemo } from "@/server/records/seed";

const dir = path.resolve("tests/.tmp");
const file = path.join(dir, `unit-${process.pid}-${Date.now()}-${Math.random().toString(36).slice(2, 8)}.db`);
mkdirSync(dir, { recursive: true });
process.env.GRAINLINE_DB = file;
delete (globalThis as { grainlineDb?: unknown }).grainlineDb;

beforeAll(async () => {
  const { db, sqlite } = openDatabase(file);
  migrateDatabase(db);
  await seedDemo(db);
  sqlite.close();
});

afterAll(() => {
  const held = (globalThis as { grainlineDb?: { sqlite: { close(): void } } }).grainlineDb;
  held?.sqlite.close();
  delete (globalThis as { grainlineDb?: unknown }).grainlineDb;
  for (const suffix of ["", "-wal", "-shm"]) rmSync(file + suffix, { force: true });
});
