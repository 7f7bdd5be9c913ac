import "server-only";
import type { DbOrTx } from "@/db/client";
import { can } from "@/domain/permissions";
import { DEFAULT_VARIETIES, listedVariety, varietyKey, type Variety } from "@/domain/varieties";
import { fieldErrorsFrom, type Translate } from "@/lib/validation/field-errors";
import { varietyEntrySchema, varietyRemovalSchema } from "@/lib/validation/registers";
import { getDb } from "../platform/db";
import { forbidden, invalid } from "../platform/errors";
import { readMasterList, writeMasterList } from "./master-lists";
import type { SessionUser } from "../accounts/session";

/** The varieties a harvest may name: the office's list, else the common-practice defaults. */
export function readVarietyList(db: DbOrTx = getDb()): Variety[] {
  return readMasterList<Variety>(db, "varietyList", DEFAULT_VARIETIES);
}

/**
 * The list's spelling of a typed variety; a name not on it is refused (the harvest form, the
 * API and the CSV import alike), and the message says where the office adds one.
 */
export function requireListedVariety(db: DbOrTx, typed: string, t: Translate): string {
  return requireOnList(readVarietyList(db), typed, t);
}

/** The same, against a list already read (an import reads it once for all its rows). */
export function requireOnList(list: readonly Variety[], typed: string, t: Translate): string {
  const name = listedVariety(list, typed);
  if (!name) throw invalid({ variety: [t("varietyList.notListed")] });
  return name;
}

export function addVariety(actor: SessionUser, raw: unknown, t: Translate) {
  if (!can(actor, "settings:manage")) throw forbidden();
  const parsed = varietyEntrySchema.safeParse(raw);
  if (!parsed.success) throw invalid(fieldErrorsFrom(parsed.error, t));
  const entry = { name: parsed.data.name.replace(/\s+/g, " "), kind: parsed.data.kind };
  return getDb().transaction((tx) => {
    const before = readVarietyList(tx);
    if (listedVariety(before, entry.name)) throw invalid({ name: [t("varietyList.alreadyListed")] });
    writeMasterList(tx, "varietyList", before, [...before, entry], actor.id, { variety: entry.name, change: "added" });
    return { name: entry.name };
  });
}

/** Taking a name off the list stops new harvests naming it; lots already named keep it. */
export function removeVariety(actor: SessionUser, raw: unknown, t: Translate) {
  if (!can(actor, "settings:manage")) throw forbidden();
  const parsed = varietyRemovalSchema.safeParse(raw);
  if (!parsed.success) throw invalid(fieldErrorsFrom(parsed.error, t));
  return getDb().transaction((tx) => {
    const before = readVarietyList(tx);
    const after = before.filter((v) => varietyKey(v.name) !== varietyKey(parsed.data.name));
    if (after.length === before.length) throw invalid({ name: [t("varietyList.notListed")] });
    writeMasterList(tx, "varietyList", before, after, actor.id, { variety: parsed.data.name, change: "removed" });
    return { name: parsed.data.name };
  });
}
