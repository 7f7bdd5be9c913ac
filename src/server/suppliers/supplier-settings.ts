import "server-only";
import { eq } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { settings } from "@/db/schema";
import { can } from "@/domain/permissions";
import { ROUNDINGS, type Rounding } from "@/domain/money";
import { DEFAULT_TAX_ROUNDING } from "@/domain/tax";
import type { Translate } from "@/lib/validation/field-errors";
import { parseSupplierInput, roundingSchema } from "@/lib/validation/suppliers";
import { recordAudit } from "../records/audit";
import { getDb } from "../platform/db";
import { forbidden, invalid } from "../platform/errors";
import type { SessionUser } from "../accounts/session";

/** Kept in the settings table under its own key, beside (not inside) the brewery's bands. */
const KEY = "taxRounding";

/** How statements round each rate's tax: the stored choice, else round down (see domain/tax.ts). */
export function readTaxRounding(db: DbOrTx = getDb()): Rounding {
  const row = db.select().from(settings).where(eq(settings.key, KEY)).get();
  const value = row ? (JSON.parse(row.value) as string) : DEFAULT_TAX_ROUNDING;
  return (ROUNDINGS as readonly string[]).includes(value) ? (value as Rounding) : DEFAULT_TAX_ROUNDING;
}

/** Applies to statements issued from now on; issued ones keep the rule they were issued with. */
export function saveTaxRounding(actor: SessionUser, raw: unknown, t: Translate): { rounding: Rounding } {
  if (!can(actor, "ledger:manage")) throw forbidden();
  const { rounding } = parseSupplierInput(roundingSchema, raw, t, (f) => invalid(f));
  return getDb().transaction((tx) => {
    const before = readTaxRounding(tx);
    if (before === rounding) return { rounding };
    const row = { key: KEY, value: JSON.stringify(rounding), updatedAt: new Date(), updatedBy: actor.id };
    tx.insert(settings).values(row).onConflictDoUpdate({ target: settings.key, set: row }).run();
    recordAudit(tx, { userId: actor.id, action: "settings.updated", subject: "settings", detail: { changed: [KEY], before: { [KEY]: before }, after: { [KEY]: rounding } } });
    return { rounding };
  });
}
