import "server-only";
import type { DbOrTx } from "@/db/client";
import { eq, sql } from "drizzle-orm";
import { eventOutputs, fields, lotSourceDeltas, lots } from "@/db/schema";
import { isTooMoistToGrade } from "@/domain/grades";
import { can, canReadFieldsOf, canRecordOnField } from "@/domain/permissions";
import type { Variety } from "@/domain/varieties";
import type { HarvestInput } from "@/lib/validation/events";
import type { Translate } from "@/lib/validation/field-errors";
import { forbidden, invalid } from "../platform/errors";
import { placeholdersFor, prepared } from "../platform/prepared";
import { insertEvent } from "./event-rows";
import { createOnce, type StoredResponse } from "./idempotency";
import { allocateLotCode } from "./lot-codes";
import type { SessionUser } from "../accounts/session";
import { readVarietyList, requireOnList } from "../floor/variety-list";

type FieldRow = typeof fields.$inferSelect;

/**
 * What a harvest reads before it writes: its field and the variety list. The API reads them
 * for each harvest; an import of thousands of rows reads each once (records/harvest-import.ts).
 */
export type HarvestLookups = { field(id: string): FieldRow | undefined; varieties(): readonly Variety[] };

export const ledgerLookups = (tx: DbOrTx): HarvestLookups => ({
  field: (id) => prepared(tx, "field-by-id", (db) => db.select().from(fields).where(eq(fields.id, sql.placeholder("id"))).prepare()).get({ id }),
  varieties: () => readVarietyList(tx),
});

/** A harvest that passed every rule, ready to write. */
export type CheckedHarvest = { input: HarvestInput; field: FieldRow; variety: string; at: Date };

/**
 * Registers a harvest lot (an EPCIS commissioning): brown rice from one field, held by its
 * grower. Its content is its brown weight — the basis polishing runs share by.
 */
export function registerHarvest(actor: SessionUser, input: HarvestInput, t: Translate, idempotencyKey: string | null = null): StoredResponse {
  return createOnce("harvests", input, actor.id, idempotencyKey, (tx) => registerHarvestInTx(tx, actor, input, t));
}

/** Registers one harvest lot inside a transaction the caller holds. */
export function registerHarvestInTx(tx: DbOrTx, actor: SessionUser, input: HarvestInput, t: Translate): { code: string; id: number } {
  return writeHarvest(tx, actor, checkHarvest(actor, input, t, ledgerLookups(tx)));
}

/** Every rule a harvest must pass, in the order the API reports them; reads, never writes. */
export function checkHarvest(actor: SessionUser, input: HarvestInput, t: Translate, look: HarvestLookups): CheckedHarvest {
  if (!can(actor, "harvests:record-own") && !can(actor, "harvests:record-any")) throw forbidden();
  // MAFF inspection standards: above 15.0 % moisture brown rice takes no grade (nor an equivalence).
  if (isTooMoistToGrade(input.moisturePct) && input.grade !== "out-of-grade") throw invalid({ grade: [t("validation.moistureTooHigh")] });
  const field = look.field(input.fieldId);
  // Another grower's field answers exactly as a field that does not exist.
  if (!field || !canReadFieldsOf(actor, field.growerId)) throw invalid({ fieldId: [t("validation.unknownField")] });
  if (!canRecordOnField(actor, field)) throw forbidden("errors.notYourField");
  const variety = requireOnList(look.varieties(), input.variety, t);
  return { input, field, variety, at: input.at ? new Date(input.at) : new Date() };
}

type NewLot = Omit<typeof lots.$inferInsert, "id">;
const LOT_FIELDS = ["code", "kind", "unit", "partyId", "originPartyId", "fieldId", "variety", "cropYear", "grade", "moisturePct", "attributes", "quantityIn", "onHand", "contentIn", "createdAt"] as const;

/** The rows of a checked harvest: its event, its lot and the lot's own composition row. Statements prepared once per connection. */
export function writeHarvest(tx: DbOrTx, actor: SessionUser, { input, field, variety, at }: CheckedHarvest): { code: string; id: number } {
  const attributes = JSON.stringify({ bags: input.bags });
  const eventId = insertEvent(tx, { step: "registering", at, recordedAt: new Date(), userId: actor.id, partyId: field.growerId, counterpartyId: null, place: field.name, referenceDoc: "", note: "", reason: "", attributes });
  const code = allocateLotCode(tx, "harvest", at);
  const lot = prepared(tx, "insert-harvest-lot", (db) => db.insert(lots).values(placeholdersFor<NewLot>(LOT_FIELDS)).returning({ id: lots.id }).prepare()).get({
    code,
    kind: "harvest",
    unit: "kg",
    partyId: field.growerId,
    originPartyId: field.growerId,
    fieldId: field.id,
    variety,
    cropYear: input.cropYear,
    grade: input.grade,
    moisturePct: input.moisturePct,
    attributes,
    quantityIn: input.brownKg,
    onHand: input.brownKg,
    contentIn: input.brownKg,
    createdAt: at,
  })!;
  // A harvest lot is a source of the lineage graph: an output with no parents.
  prepared(tx, "insert-harvest-output", (db) => db.insert(eventOutputs).values(placeholdersFor<typeof eventOutputs.$inferInsert>(["eventId", "lotId", "quantity", "content"])).prepare()).run({ eventId, lotId: lot.id, quantity: input.brownKg, content: input.brownKg });
  prepared(tx, "insert-harvest-source", (db) => db.insert(lotSourceDeltas).values(placeholdersFor<typeof lotSourceDeltas.$inferInsert>(["eventId", "lotId", "sourceLotId", "amount"])).prepare()).run({ eventId, lotId: lot.id, sourceLotId: lot.id, amount: input.brownKg });
  return { code, id: eventId };
}
