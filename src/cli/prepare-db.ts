/** Migrates GRAINLINE_DB and seeds the demo scenario if it is empty (what `npm start` does first). */
import { migrateDatabase, openDatabase } from "../db/client";
import { seedDemo } from "../server/records/seed";

export async function prepareDatabase(file: string, seed: boolean): Promise<boolean> {
  const { db, sqlite } = openDatabase(file);
  try {
    migrateDatabase(db);
    return seed ? await seedDemo(db) : false;
  } finally {
    sqlite.close();
  }
}

if (process.argv[1]?.endsWith("prepare-db.ts")) {
  await prepareDatabase(process.env.GRAINLINE_DB || "data/grainline.db", process.env.GRAINLINE_SEED !== "none");
}
