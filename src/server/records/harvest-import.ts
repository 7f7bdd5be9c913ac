import "server-only";
import { eq } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { fields } from "@/db/schema";
import { can } from "@/domain/permissions";
import type { Variety } from "@/domain/varieties";
import { harvestCsvRowSchema, noonOn } from "@/lib/validation/csv";
import { harvestSchema } from "@/lib/validation/events";
import type { Translate } from "@/lib/validation/field-errors";
import { invalid, type FieldErrors } from "../platform/errors";
import { breweryTimeZone } from "../platform/settings";
import { checkHarvest, ledgerLookups, type CheckedHarvest, type HarvestLookups } from "../ledger/harvests";
import type { SessionUser } from "../accounts/session";
import { merge, resolve } from "./import-cells";

/**
 * The harvest rows of one file, checked against the ledger as it stands: the rules of the
 * harvest API (ledger/harvests.ts), with what they read — the brewery's clock, the variety
 * list, each field the file names — read once for the file rather than once a row. A harvest
 * row reads nothing another row writes, so a check needs no dry-run write.
 */
export function harvestFile(tx: DbOrTx, actor: SessionUser, t: Translate): HarvestRowCheck {
  const look = onceEach(tx);
  const timeZone = breweryTimeZone(tx);
  const noons = new Map<string, string>();
  const noon = (day: string) => noons.get(day) ?? noons.set(day, noonOn(day, timeZone)).get(day)!;
  const visible = can(actor, "fields:read-all") ? undefined : eq(fields.growerId, actor.partyId);
  const unknownField = t("validation.unknownField");
  const refs = new Map<string, string | FieldErrors>();
  // By id the field is found wherever it is; the harvest then answers another grower's field
  // as unknown, as the API does.
  const fieldRef = (value: string) => refs.get(value) ?? refs.set(value, look.field(value.trim()) ? value.trim() : resolve(tx, fields, value, visible, "field", unknownField, t)).get(value)!;

  /** A line's values as a harvest ready to write; throws what the row's problem is. */
  return function checkRow(values: Record<string, string>): CheckedHarvest {
    const row = harvestCsvRowSchema.safeParse(values);
    const fieldId = fieldRef(values.field ?? "");
    if (!row.success || typeof fieldId !== "string") throw invalid(merge(row, fieldId, t));
    const { field: _field, harvestedOn, ...rest } = row.data;
    const input = harvestSchema.parse({ fieldId, ...rest, ...(harvestedOn ? { at: noon(harvestedOn) } : {}) });
    return checkHarvest(actor, input, t, look);
  };
}

export type HarvestRowCheck = (values: Record<string, string>) => CheckedHarvest;

function onceEach(tx: DbOrTx): HarvestLookups {
  const ledger = ledgerLookups(tx);
  const byId = new Map<string, ReturnType<HarvestLookups["field"]>>();
  let varieties: readonly Variety[] | undefined;
  return {
    field: (id) => (byId.has(id) ? byId.get(id) : byId.set(id, ledger.field(id)).get(id)),
    varieties: () => (varieties ??= ledger.varieties()),
  };
}
