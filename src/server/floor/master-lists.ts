import "server-only";
import { eq } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { settings } from "@/db/schema";
import { recordAudit } from "../records/audit";

/**
 * Lists the office keeps beside the brewery settings (the tank register, the variety list):
 * one JSON value per key in the settings table. Every change writes the whole list again and
 * an audit entry with the list before and after, so nothing said earlier is lost.
 */
export type MasterList = "tankRegister" | "varietyList";

export function readMasterList<T>(db: DbOrTx, key: MasterList, fallback: T[]): T[] {
  const row = db.select({ value: settings.value }).from(settings).where(eq(settings.key, key)).get();
  return row ? (JSON.parse(row.value) as T[]) : fallback;
}

export function writeMasterList<T>(db: DbOrTx, key: MasterList, before: T[], after: T[], userId: string, change: Record<string, unknown>) {
  const row = { key, value: JSON.stringify(after), updatedAt: new Date(), updatedBy: userId };
  db.insert(settings).values(row).onConflictDoUpdate({ target: settings.key, set: row }).run();
  recordAudit(db, { userId, action: "settings.updated", subject: key, detail: { ...change, before, after } });
}

/** The demo seed's starting list: data put in place, not a change anyone made, so no audit entry. */
export function seedMasterList<T>(db: DbOrTx, key: MasterList, value: T[], userId: string) {
  db.insert(settings).values({ key, value: JSON.stringify(value), updatedAt: new Date(), updatedBy: userId }).run();
}
