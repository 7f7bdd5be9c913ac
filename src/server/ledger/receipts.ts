import "server-only";
import { and, desc, eq, sql } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { eventInputs, events, lots, parties, receiptRequests } from "@/db/schema";
import { contentOfDraw } from "@/domain/composition";
import { isValidLotCode } from "@/domain/lot-code";
import { canSeeLot } from "@/domain/permissions";
import type { PartyKind } from "@/domain/roles";
import { RECEIVABLE_KINDS } from "@/domain/steps";
import type { EventInput } from "@/lib/validation/events";
import type { Translate } from "@/lib/validation/field-errors";
import { AppError, invalid, type FieldErrors } from "../platform/errors";
import { insertEvent, insertEventInput, lotByCode, partyKind, requireAny, resolveEventParty, writeMeasurements, type LotRow } from "./event-rows";
import type { SessionUser } from "../accounts/session";
import { recordSupplierEntries } from "../suppliers/supplier-entries";

/** Tolerance for float sums of weights (a milligram). */
const EPS = 1e-6;

export const inTransit = (lot: { inTransitTo: string | null }) => lot.inTransitTo !== null;

/** What a dispatch needs beyond the holder's say: another party, one that takes in the lot's kind, and a lot not already on its way. */
export function checkDispatch(tx: DbOrTx, d: { eventParty: string; counterparty: { id: string; kind: PartyKind }; lots: LotRow[] }, t: Translate) {
  if (d.counterparty.id === d.eventParty) throw invalid({ counterpartyId: [t("validation.notToSelf")] });
  const errors: FieldErrors = {};
  d.lots.forEach((lot, n) => {
    if (lot.partyId !== d.eventParty) errors[`inputs.${n}.lot`] = [t("validation.notHeld")];
    else if (!RECEIVABLE_KINDS[d.counterparty.kind].includes(lot.kind)) errors[`inputs.${n}.lot`] = [t("validation.notTakenIn", { kind: t(`lot.kinds.${lot.kind}`) })];
  });
  if (Object.keys(errors).length) throw invalid(errors);
}

export type OpenDispatch = { id: number; slip: number; referenceDoc: string; at: Date };

/** The dispatch a lot in transit is travelling under: the latest one on it (a lot has one open at a time). */
export function openDispatch(tx: DbOrTx, lot: LotRow): OpenDispatch | null {
  if (!lot.inTransitTo) return null;
  const row = tx
    .select({ id: events.id, slip: eventInputs.quantity, referenceDoc: events.referenceDoc, at: events.at })
    .from(eventInputs)
    .innerJoin(events, eq(events.id, eventInputs.eventId))
    .where(and(eq(eventInputs.lotId, lot.id), eq(eventInputs.use, "dispatch")))
    .orderBy(desc(eventInputs.id))
    .get();
  return row ?? null;
}

/**
 * A receipt (POST /api/events, the receive form, the CSV import): it moves custody only when it
 * answers a dispatch the holder addressed to the receiving party. Anything else — no such code,
 * a lot the receiver may not see, a lot its holder has not sent — is kept as typed, awaiting the
 * sender's word, with one and the same answer, so a receipt tells no one that a code exists.
 */
export function applyReceipt(tx: DbOrTx, actor: SessionUser, input: EventInput, t: Translate) {
  requireAny(actor, ["polishing:record", "brewing:record"]);
  const errors: FieldErrors = {};
  const fail = (field: string, message: string) => (errors[field] ??= []).push(message);
  if (input.corrects !== undefined) fail("corrects", t("validation.notForStep"));
  if (input.outputs.length) fail("outputs", t("validation.notForStep"));
  if (input.inputs.length !== 1) fail("inputs", t("validation.oneLotPerReceipt"));
  const named = input.inputs[0];
  if (named && !(named.quantity > 0)) fail("inputs.0.quantity", t("validation.moreThan", { minimum: 0 }));
  // A request is kept as typed, so what it names must at least be written as a lot code.
  if (named && !isValidLotCode(named.lot)) fail("inputs.0.lot", t("validation.notALotCode"));
  input.measurements.forEach((m, n) => m.lot && m.lot !== named?.lot && fail(`measurements.${n}.lot`, t("validation.unknownLot")));
  const receiver = resolveEventParty(tx, actor, input, t);
  if (input.counterpartyId && !tx.select({ id: parties.id }).from(parties).where(eq(parties.id, input.counterpartyId)).get()) fail("counterpartyId", t("validation.unknownCounterparty"));
  if (Object.keys(errors).length) throw invalid(errors);

  const lot = lotByCode(tx, named!.lot);
  const refuse = (key: string) => new AppError("conflict", { key, values: { code: lot!.code } }, { "inputs.0.lot": [t(key, { code: lot!.code })] });
  // What the receiver holds or may see already, it may be told about; nothing else.
  if (lot?.partyId === receiver) throw refuse("errors.alreadyHeld");
  if (lot && canSeeLot(actor, lot) && !RECEIVABLE_KINDS[partyKind(tx, receiver)].includes(lot.kind)) {
    throw invalid({ "inputs.0.lot": [t("validation.kindNotAllowed", { step: t("steps.receiving"), kind: t(`lot.kinds.${lot.kind}`) })] });
  }
  const dispatch = lot && lot.inTransitTo === receiver ? openDispatch(tx, lot) : null;
  if (!lot || !dispatch) return awaitSender(tx, actor, receiver, input);
  if (input.counterpartyId && input.counterpartyId !== lot.partyId) throw refuse("errors.notHeldBySender");
  if (named!.quantity > dispatch.slip + EPS) throw invalid({ "inputs.0.quantity": [t("validation.arrivalOverSlip", { slip: dispatch.slip, unit: lot.unit })] });
  return receiveDispatched(tx, { userId: actor.id, receiver, lot, dispatch, input }, t);
}

const AWAITING = { id: null, awaiting: "sender", outputs: [], warnings: [] } as const;

function awaitSender(tx: DbOrTx, actor: SessionUser, receiver: string, input: EventInput) {
  const named = input.inputs[0]!;
  tx.insert(receiptRequests)
    .values({
      receiverPartyId: receiver,
      code: named.lot,
      quantity: named.quantity,
      senderPartyId: input.counterpartyId ?? null,
      referenceDoc: input.referenceDoc ?? "",
      place: input.place ?? "",
      note: input.note ?? "",
      measurements: JSON.stringify(input.measurements),
      at: input.at ? new Date(input.at) : new Date(),
      userId: actor.id,
      recordedAt: new Date(),
    })
    .run();
  return { ...AWAITING, outputs: [] as [], warnings: [] as [] };
}

type Receipt = { userId: string; receiver: string; lot: LotRow; dispatch: OpenDispatch; input: EventInput };

/**
 * Custody moves: the receiver holds the lot, on hand becomes the weight on arrival, and the
 * shortfall (slip − arrival, the loss in transit) is its own input row, so a correction can
 * give it back. The grower's payable is priced on the weight that arrived.
 */
export function receiveDispatched(tx: DbOrTx, r: Receipt, t: Translate) {
  const arrival = r.input.inputs[0]!.quantity;
  const shortfall = r.dispatch.slip - arrival > EPS ? r.dispatch.slip - arrival : 0;
  const at = r.input.at ? new Date(r.input.at) : new Date();
  // Rice arrives after it was sent: a receipt dated before its slip is a typing slip.
  if (at < r.dispatch.at) throw invalid({ at: [t("validation.receiptBeforeDispatch", { date: r.dispatch.at.toISOString().slice(0, 10) })] });
  const eventId = insertEvent(tx, {
    step: "receiving",
    at,
    recordedAt: new Date(),
    userId: r.userId,
    partyId: r.receiver,
    counterpartyId: r.lot.partyId,
    place: r.input.place ?? "",
    referenceDoc: r.input.referenceDoc || r.dispatch.referenceDoc,
    note: r.input.note ?? "",
    reason: "",
    attributes: JSON.stringify({ ...r.input.attributes, dispatch: r.dispatch.id, slipQuantity: r.dispatch.slip, arrivalQuantity: arrival, shortfall }),
  });
  insertEventInput(tx, { eventId, lotId: r.lot.id, quantity: arrival, content: 0, use: "move", previousPartyId: r.lot.partyId });
  if (shortfall) insertEventInput(tx, { eventId, lotId: r.lot.id, quantity: shortfall, content: contentOfDraw(shortfall, r.lot), use: "loss", previousPartyId: null });
  tx.update(lots)
    .set({ partyId: r.receiver, inTransitTo: null, onHand: sql`${lots.onHand} - ${shortfall}` })
    .where(eq(lots.id, r.lot.id))
    .run();
  writeMeasurements(tx, eventId, r.input, [r.lot], [], t);
  const sender = { id: r.lot.partyId, kind: partyKind(tx, r.lot.partyId) };
  recordSupplierEntries(tx, { eventId, step: "receiving", eventParty: r.receiver, counterparty: sender, draws: [{ lot: r.lot, quantity: arrival, use: "move" }], at });
  return { id: eventId, outputs: [], warnings: [] as string[] };
}

/** Whether an event to be corrected touches a lot now in transit (other than by dispatching it): its dispatch is corrected first. */
export function touchesLotInTransit(tx: DbOrTx, originalId: number): string | null {
  const row = tx.get<{ code: string } | undefined>(sql`
    select l.code from lots l
    where l.in_transit_to is not null and l.id in (
      select lot_id from event_inputs where event_id = ${originalId} and use not in ('dispatch', 'observe')
      union select lot_id from event_outputs where event_id = ${originalId})
    limit 1`);
  return row?.code ?? null;
}
