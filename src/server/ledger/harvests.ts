import "server-only";
import type { DbOrTx } from "@/db/client";
import { eq } from "drizzle-orm";
import { eventOutputs, events, fields, lotSourceDeltas, lots } from "@/db/schema";
import { isTooMoistToGrade } from "@/domain/grades";
import { can, canReadFieldsOf, canRecordOnField } from "@/domain/permissions";
import type { HarvestInput } from "@/lib/validation/events";
import type { Translate } from "@/lib/validation/field-errors";
import { forbidden, invalid } from "../platform/errors";
import { createOnce, type StoredResponse } from "./idempotency";
import { allocateLotCode } from "./lot-codes";
import type { SessionUser } from "../accounts/session";
import { requireListedVariety } from "../floor/variety-list";

/**
 * Registers a harvest lot (an EPCIS commissioning): brown rice from one field, held by its
 * grower. Its content is its brown weight — the basis polishing runs share by.
 */
export function registerHarvest(actor: SessionUser, input: HarvestInput, t: Translate, idempotencyKey: string | null = null): StoredResponse {
  return createOnce("harvests", input, actor.id, idempotencyKey, (tx) => registerHarvestInTx(tx, actor, input, t));
}

/** Registers one harvest lot inside a transaction the caller holds. */
export function registerHarvestInTx(tx: DbOrTx, actor: SessionUser, input: HarvestInput, t: Translate): { code: string; id: number } {
  if (!can(actor, "harvests:record-own") && !can(actor, "harvests:record-any")) throw forbidden();
  // MAFF inspection standards: above 15.0 % moisture brown rice takes no grade (nor an equivalence).
  if (isTooMoistToGrade(input.moisturePct) && input.grade !== "out-of-grade") throw invalid({ grade: [t("validation.moistureTooHigh")] });
  const field = tx.select().from(fields).where(eq(fields.id, input.fieldId)).get();
  // Another grower's field answers exactly as a field that does not exist.
  if (!field || !canReadFieldsOf(actor, field.growerId)) throw invalid({ fieldId: [t("validation.unknownField")] });
  if (!canRecordOnField(actor, field)) throw forbidden("errors.notYourField");
  const variety = requireListedVariety(tx, input.variety, t);
  const at = input.at ? new Date(input.at) : new Date();
  const eventId = tx
    .insert(events)
    .values({ step: "registering", at, recordedAt: new Date(), userId: actor.id, partyId: field.growerId, place: field.name, attributes: JSON.stringify({ bags: input.bags }) })
    .returning({ id: events.id })
    .get().id;
  const lot = tx
    .insert(lots)
    .values({
      code: allocateLotCode(tx, "harvest", at),
      kind: "harvest",
      unit: "kg",
      partyId: field.growerId,
      originPartyId: field.growerId,
      fieldId: field.id,
      variety,
      cropYear: input.cropYear,
      grade: input.grade,
      moisturePct: input.moisturePct,
      attributes: JSON.stringify({ bags: input.bags }),
      quantityIn: input.brownKg,
      onHand: input.brownKg,
      contentIn: input.brownKg,
      createdAt: at,
    })
    .returning()
    .get();
  // A harvest lot is a source of the lineage graph: an output with no parents.
  tx.insert(eventOutputs).values({ eventId, lotId: lot.id, quantity: input.brownKg, content: input.brownKg }).run();
  tx.insert(lotSourceDeltas).values({ eventId, lotId: lot.id, sourceLotId: lot.id, amount: input.brownKg }).run();
  return { code: lot.code, id: eventId };
}
