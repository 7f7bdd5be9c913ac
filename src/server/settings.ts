import "server-only";
import { eq } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { settings } from "@/db/schema";
import { DEFAULT_ABSORPTION_BANDS, DEFAULT_KOJI_BANDS, DEFAULT_STEAM_GAIN_BANDS } from "@/domain/brewing";

/** Defaults of the settings the office may change; the source of each is noted. */
export const SETTING_DEFAULTS = {
  // Issue text: a visible warning when achieved and target polishing ratio differ by more than 1 point.
  polishingMarginPts: 1 as number,
  absorptionBands: DEFAULT_ABSORPTION_BANDS,
  steamGainBands: DEFAULT_STEAM_GAIN_BANDS,
  kojiBands: DEFAULT_KOJI_BANDS,
};
export type SettingKey = keyof typeof SETTING_DEFAULTS;

export function readSetting<K extends SettingKey>(db: DbOrTx, key: K): (typeof SETTING_DEFAULTS)[K] {
  const row = db.select().from(settings).where(eq(settings.key, key)).get();
  return row ? (JSON.parse(row.value) as (typeof SETTING_DEFAULTS)[K]) : SETTING_DEFAULTS[key];
}

export function writeSetting<K extends SettingKey>(db: DbOrTx, key: K, value: (typeof SETTING_DEFAULTS)[K], userId: string) {
  const row = { key, value: JSON.stringify(value), updatedAt: new Date(), updatedBy: userId };
  db.insert(settings).values(row).onConflictDoUpdate({ target: settings.key, set: row }).run();
}
