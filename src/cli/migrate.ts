/** `npm run db:migrate`: applies the committed migrations to GRAINLINE_DB. */
import { migrateDatabase, openDatabase } from "../db/client";

const file = process.env.GRAINLINE_DB || "data/grainline.db";
const { db, sqlite } = openDatabase(file);
migrateDatabase(db);
sqlite.close();
console.log(`Migrated ${file}.`);
