import "server-only";
import { and, desc, eq, isNull, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/sqlite-core";
import { z } from "zod";
import type { DbOrTx } from "@/db/client";
import { lots, parties, receiptOutcomes, receiptRequests } from "@/db/schema";
import { can, canDispatchLot } from "@/domain/permissions";
import { eventSchema, measurementSchema } from "@/lib/validation/events";
import type { Translate } from "@/lib/validation/field-errors";
import { getDb, writeTransaction } from "../platform/db";
import { AppError, forbidden, invalid, notFound } from "../platform/errors";
import { applyEvent } from "./events";
import { lotByCode } from "./event-rows";
import { openDispatch, receiveDispatched } from "./receipts";
import type { SessionUser } from "../accounts/session";

type Request = typeof receiptRequests.$inferSelect;
const receiver = alias(parties, "receiver");

/** The requests a sender answers: those naming a lot its party holds (the office: every one), still open. */
export function listRequestsToAnswer(actor: SessionUser) {
  const mine: SQL | undefined = can(actor, "lots:act-any") ? undefined : eq(lots.partyId, actor.partyId);
  return getDb()
    .select({ id: receiptRequests.id, code: receiptRequests.code, quantity: receiptRequests.quantity, referenceDoc: receiptRequests.referenceDoc, at: receiptRequests.at, receiver: receiver.name, unit: lots.unit })
    .from(receiptRequests)
    .innerJoin(receiver, eq(receiver.id, receiptRequests.receiverPartyId))
    .leftJoin(lots, eq(lots.code, receiptRequests.code))
    .leftJoin(receiptOutcomes, eq(receiptOutcomes.requestId, receiptRequests.id))
    .where(and(isNull(receiptOutcomes.id), mine))
    .orderBy(desc(receiptRequests.id))
    .all();
}

/** A receiver's own requests and where each stands: awaiting, confirmed (with its receipt) or declined (with the reason). */
export function listOwnRequests(actor: SessionUser) {
  return getDb()
    .select({ id: receiptRequests.id, code: receiptRequests.code, quantity: receiptRequests.quantity, referenceDoc: receiptRequests.referenceDoc, at: receiptRequests.at, outcome: receiptOutcomes.outcome, reason: receiptOutcomes.reason, eventId: receiptOutcomes.eventId })
    .from(receiptRequests)
    .leftJoin(receiptOutcomes, eq(receiptOutcomes.requestId, receiptRequests.id))
    .where(eq(receiptRequests.receiverPartyId, actor.partyId))
    .orderBy(desc(receiptRequests.id))
    .limit(50)
    .all()
    .map((r) => ({ ...r, outcome: r.outcome ?? ("awaiting" as const) }));
}

export const answerSchema = z.object({ requestId: z.coerce.number().int().positive().max(Number.MAX_SAFE_INTEGER) });
export const declineSchema = answerSchema.extend({ reason: z.string().trim().min(3).max(500) });

/**
 * The request as its would-be answerer may see it: the holder of the lot it names (who may
 * dispatch it) or the office. Anyone else is told it does not exist — the receiver excepted,
 * who knows its own request and is told that the sender answers it.
 */
function requestFor(tx: DbOrTx, actor: SessionUser, id: number) {
  const request = tx.select().from(receiptRequests).where(eq(receiptRequests.id, id)).get();
  const lot = request ? lotByCode(tx, request.code) : undefined;
  const answers = request && (can(actor, "lots:act-any") || (lot !== undefined && canDispatchLot(actor, lot)));
  if (!answers) {
    if (request?.receiverPartyId === actor.partyId) throw forbidden("errors.senderConfirms");
    throw notFound("errors.receiptRequestNotFound");
  }
  if (tx.select({ id: receiptOutcomes.id }).from(receiptOutcomes).where(eq(receiptOutcomes.requestId, id)).get()) throw new AppError("conflict", "errors.requestAnswered");
  return { request: request!, lot };
}

/** The sender's word, given late: its dispatch and the receipt, in one transaction. Custody moves now. */
export function confirmReceiptRequest(actor: SessionUser, id: number, t: Translate) {
  return writeTransaction((tx) => {
    const { request, lot } = requestFor(tx, actor, id);
    if (!lot) throw new AppError("conflict", { key: "errors.notHeldBySender", values: { code: request.code } });
    if (lot.inTransitTo !== request.receiverPartyId) {
      // The office answers for the holder; the dispatch is the holder's, of the whole lot.
      const slip = eventSchema.parse({ step: "shipping", at: request.at.toISOString(), inputs: [{ lot: lot.code, quantity: lot.onHand }], counterpartyId: request.receiverPartyId, partyId: lot.partyId, referenceDoc: request.referenceDoc || undefined });
      applyEvent(tx, actor, slip, t);
    }
    const current = lotByCode(tx, lot.code)!;
    const dispatch = openDispatch(tx, current)!;
    if (request.quantity > dispatch.slip + 1e-6) throw new AppError("conflict", { key: "errors.arrivalOverSlip", values: { arrival: request.quantity, slip: dispatch.slip, unit: lot.unit } });
    const input = eventSchema.parse({
      step: "receiving",
      at: request.at.toISOString(),
      inputs: [{ lot: lot.code, quantity: request.quantity }],
      referenceDoc: request.referenceDoc || undefined,
      place: request.place || undefined,
      note: request.note || undefined,
      measurements: z.array(measurementSchema).catch([]).parse(JSON.parse(request.measurements)),
    });
    const receipt = receiveDispatched(tx, { userId: request.userId, receiver: request.receiverPartyId, lot: current, dispatch, input }, t);
    answer(tx, actor, request, { outcome: "confirmed", eventId: receipt.id });
    return { id: request.id, outcome: "confirmed" as const, eventId: receipt.id };
  });
}

/** The sender does not recognise the receipt: it stays on record, declined with the reason; nothing moves. */
export function declineReceiptRequest(actor: SessionUser, id: number, reason: string, t: Translate) {
  if (reason.trim().length < 3) throw invalid({ reason: [t("validation.needsReason")] });
  return writeTransaction((tx) => {
    const { request } = requestFor(tx, actor, id);
    answer(tx, actor, request, { outcome: "declined", reason: reason.trim() });
    return { id: request.id, outcome: "declined" as const };
  });
}

function answer(tx: DbOrTx, actor: SessionUser, request: Request, a: { outcome: "confirmed" | "declined"; eventId?: number; reason?: string }) {
  tx.insert(receiptOutcomes).values({ requestId: request.id, outcome: a.outcome, eventId: a.eventId ?? null, reason: a.reason ?? "", userId: actor.id, recordedAt: new Date() }).run();
}
