import "server-only";
import { desc, eq, inArray, sql } from "drizzle-orm";
import { z } from "zod";
import type { DbOrTx } from "@/db/client";
import { settings, users } from "@/db/schema";
import { DEFAULT_ABSORPTION_BANDS, DEFAULT_KOJI_BANDS, DEFAULT_STEAM_GAIN_BANDS } from "@/domain/brewing";
import { can } from "@/domain/permissions";
import { DEFAULT_TIME_ZONE, isTimeZone } from "@/i18n/dates";
import { fieldErrorsFrom, type Translate } from "@/lib/validation/field-errors";
import { settingsSchema } from "@/lib/validation/settings";
import { recordAudit } from "../records/audit";
import { getDb } from "./db";
import { forbidden, invalid, type FieldErrors } from "./errors";
import { prepared } from "./prepared";
import type { SessionUser } from "../accounts/session";

/** Defaults of the settings the office may change; the source of each is noted. */
export const SETTING_DEFAULTS = {
  // Issue text: a visible warning when achieved and target polishing ratio differ by more than 1 point.
  polishingMarginPts: 1 as number,
  absorptionBands: DEFAULT_ABSORPTION_BANDS,
  steamGainBands: DEFAULT_STEAM_GAIN_BANDS,
  kojiBands: DEFAULT_KOJI_BANDS,
  // The brewery's clock; Japan keeps one zone, UTC+9 with no DST (IANA tz database).
  timeZone: DEFAULT_TIME_ZONE as string,
  // What the public bottle page may show; prices and contact details never appear there.
  publicProvenance: { varieties: true, origin: true, growers: true, polishingRatio: true, categories: true, dates: true } as Record<
    "varieties" | "origin" | "growers" | "polishingRatio" | "categories" | "dates",
    boolean
  >,
};
export type SettingKey = keyof typeof SETTING_DEFAULTS;

export function readSetting<K extends SettingKey>(db: DbOrTx, key: K): (typeof SETTING_DEFAULTS)[K] {
  const row = prepared(db, "setting-by-key", (d) => d.select().from(settings).where(eq(settings.key, sql.placeholder("key"))).prepare()).get({ key });
  return row ? (JSON.parse(row.value) as (typeof SETTING_DEFAULTS)[K]) : SETTING_DEFAULTS[key];
}

export function writeSetting<K extends SettingKey>(db: DbOrTx, key: K, value: (typeof SETTING_DEFAULTS)[K], userId: string) {
  const row = { key, value: JSON.stringify(value), updatedAt: new Date(), updatedBy: userId };
  db.insert(settings).values(row).onConflictDoUpdate({ target: settings.key, set: row }).run();
}

/** The brewery's clock for screens, exports and PDFs; a zone the runtime has since dropped falls back to the default. */
export function breweryTimeZone(db: DbOrTx = getDb()): string {
  const zone = readSetting(db, "timeZone");
  return isTimeZone(zone) ? zone : DEFAULT_TIME_ZONE;
}

export const SETTING_KEYS = Object.keys(SETTING_DEFAULTS) as SettingKey[];
export type BrewerySettings = { [K in SettingKey]: (typeof SETTING_DEFAULTS)[K] };

/** Every setting as it stands now (the stored value, else its default). */
export function readSettings(db: DbOrTx = getDb()): BrewerySettings {
  return Object.fromEntries(SETTING_KEYS.map((key) => [key, readSetting(db, key)])) as BrewerySettings;
}

/** When the settings were last saved and by whom; null while every one is a default. */
export function lastSettingsChange(): { at: Date; by: string } | null {
  const row = getDb()
    .select({ at: settings.updatedAt, by: users.name })
    .from(settings)
    .leftJoin(users, eq(users.id, settings.updatedBy))
    .where(inArray(settings.key, SETTING_KEYS))
    .orderBy(desc(settings.updatedAt))
    .get();
  return row ? { at: row.at, by: row.by ?? "—" } : null;
}

/**
 * The office saves the brewery's bands and margin: all of them valid or none saved. Only
 * the settings that differ are written; one audit entry says what they were and became.
 */
export function saveSettings(actor: SessionUser, raw: unknown, t: Translate): { changed: SettingKey[] } {
  if (!can(actor, "settings:manage")) throw forbidden();
  const parsed = settingsSchema.safeParse(raw);
  if (!parsed.success) throw invalid(settingsFieldErrors(parsed.error, t));
  return getDb().transaction((tx) => {
    const before = readSettings(tx);
    const changed = SETTING_KEYS.filter((key) => JSON.stringify(before[key]) !== JSON.stringify(parsed.data[key]));
    for (const key of changed) writeSetting(tx, key, parsed.data[key] as never, actor.id);
    if (changed.length) {
      const pick = (s: Record<string, unknown>) => Object.fromEntries(changed.map((k) => [k, s[k]]));
      recordAudit(tx, { userId: actor.id, action: "settings.updated", subject: "settings", detail: { changed, before: pick(before), after: pick(parsed.data) } });
    }
    return { changed };
  });
}

/** Back to the defaults in the code: the stored values go, and the audit log keeps them. */
export function restoreSettingDefaults(actor: SessionUser): { changed: SettingKey[] } {
  if (!can(actor, "settings:manage")) throw forbidden();
  return getDb().transaction((tx) => {
    const stored = tx.select({ key: settings.key }).from(settings).where(inArray(settings.key, SETTING_KEYS)).all().map((r) => r.key as SettingKey);
    if (!stored.length) return { changed: [] };
    const before = readSettings(tx);
    tx.delete(settings).where(inArray(settings.key, stored)).run();
    recordAudit(tx, { userId: actor.id, action: "settings.updated", subject: "settings", detail: { restoredDefaults: true, changed: stored, before: Object.fromEntries(stored.map((k) => [k, before[k]])) } });
    return { changed: stored };
  });
}

/** Zod issues as field messages; the band-order rule speaks from this page's own catalogue. */
function settingsFieldErrors(error: z.ZodError, t: Translate): FieldErrors {
  const out: FieldErrors = {};
  for (const issue of error.issues) {
    const own = issue.code === "custom" && issue.message.startsWith("settingsPage.");
    const part = own ? { [issue.path.join(".")]: [t(issue.message)] } : fieldErrorsFrom(new z.ZodError([issue]), t);
    for (const [field, messages] of Object.entries(part)) (out[field] ??= []).push(...messages);
  }
  return out;
}
