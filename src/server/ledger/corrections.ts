import "server-only";
import { eq, sql } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { eventInputs, eventOutputs, events, lineageEdges, lotSourceDeltas, lots } from "@/db/schema";
import type { EventInput } from "@/lib/validation/events";
import type { Translate } from "@/lib/validation/field-errors";
import { canSeeEvent, refusalToCorrect } from "./correction-rights";
import { AppError, invalid } from "../platform/errors";
import { insertInChunks } from "./batch";
import type { SessionUser } from "../accounts/session";
import { reverseSupplierEntries } from "../suppliers/supplier-entries";
import { touchesLotInTransit } from "./receipts";

const EPS = 1e-6;

/**
 * A correction is a new event that undoes an earlier one: what it made is taken back,
 * what it drew is returned, lots it moved go back to their holder, and its lineage edges
 * are cancelled by edges of opposite weight. The earlier event stays as it was.
 */
export function correctEvent(tx: DbOrTx, actor: SessionUser, input: EventInput, t: Translate) {
  const errors: Record<string, string[]> = {};
  if (!input.corrects) errors.corrects = [t("validation.required")];
  if (!input.reason || input.reason.length < 3) errors.reason = [t("validation.needsReason")];
  if (input.inputs.length || input.outputs.length) errors.inputs = [t("validation.notForStep")];
  if (Object.keys(errors).length) throw invalid(errors);

  const original = tx.select().from(events).where(eq(events.id, input.corrects!)).get();
  // An event the reader may not see answers exactly as one that does not exist.
  if (!original || original.step === "correcting" || !canSeeEvent(tx, actor, original)) throw invalid({ corrects: [t("validation.cannotCorrect")] });
  const refused = refusalToCorrect(tx, actor, original);
  if (refused) throw new AppError("forbidden", refused, { corrects: [t(refused)] });
  if (tx.select({ id: events.id }).from(events).where(eq(events.corrects, original.id)).get()) {
    throw new AppError("conflict", "errors.alreadyCorrected", { corrects: [t("validation.alreadyCorrected")] });
  }
  const travelling = touchesLotInTransit(tx, original.id);
  if (travelling) throw new AppError("conflict", { key: "errors.inTransit", values: { code: travelling } });

  const id = tx
    .insert(events)
    .values({
      step: "correcting",
      at: input.at ? new Date(input.at) : new Date(),
      recordedAt: new Date(),
      userId: actor.id,
      partyId: actor.partyId,
      counterpartyId: original.counterpartyId,
      note: input.note ?? "",
      corrects: original.id,
      reason: input.reason!,
    })
    .returning({ id: events.id })
    .get().id;

  takeBackOutputs(tx, id, original.id);
  returnInputs(tx, id, original);
  const edges = tx.select().from(lineageEdges).where(eq(lineageEdges.eventId, original.id)).all();
  if (edges.length) {
    insertInChunks(edges.map((e) => ({ eventId: id, parentLotId: e.parentLotId, childLotId: e.childLotId, weight: -e.weight })), (rows) => tx.insert(lineageEdges).values(rows).run());
  }
  const deltas = tx.select().from(lotSourceDeltas).where(eq(lotSourceDeltas.eventId, original.id)).all();
  if (deltas.length) {
    insertInChunks(deltas.map((d) => ({ eventId: id, lotId: d.lotId, sourceLotId: d.sourceLotId, amount: -d.amount })), (rows) => tx.insert(lotSourceDeltas).values(rows).run());
  }
  reverseSupplierEntries(tx, { correctionId: id, originalId: original.id });
  return { id, outputs: [], warnings: [] as string[] };
}

function takeBackOutputs(tx: DbOrTx, correctionId: number, originalId: number) {
  for (const out of tx.select().from(eventOutputs).where(eq(eventOutputs.eventId, originalId)).all()) {
    const changed = tx
      .update(lots)
      .set({
        onHand: sql`${lots.onHand} - ${out.quantity}`,
        quantityIn: sql`${lots.quantityIn} - ${out.quantity}`,
        contentIn: sql`${lots.contentIn} - ${out.content}`,
      })
      .where(sql`${lots.id} = ${out.lotId} and ${lots.onHand} + ${EPS} >= ${out.quantity}`)
      .run().changes;
    if (changed === 0) {
      const lot = tx.select({ code: lots.code }).from(lots).where(eq(lots.id, out.lotId)).get()!;
      throw new AppError("conflict", { key: "errors.usedSince", values: { code: lot.code } });
    }
    tx.insert(eventInputs).values({ eventId: correctionId, lotId: out.lotId, quantity: out.quantity, content: out.content, use: "draw" }).run();
  }
}

function returnInputs(tx: DbOrTx, correctionId: number, original: typeof events.$inferSelect) {
  // Where a move took the lot: the receiving party. A receipt that answered a dispatch hands the
  // lot back to its sender still on its way to the receiver (the dispatch stands until corrected).
  const destination = original.partyId;
  const reopens = original.step === "receiving" && (JSON.parse(original.attributes) as { dispatch?: number }).dispatch !== undefined;
  for (const input of tx.select().from(eventInputs).where(eq(eventInputs.eventId, original.id)).all()) {
    if (input.use === "dispatch") {
      // Withdrawn while open only: once received, the receipt is corrected first.
      const withdrawn = tx.update(lots).set({ inTransitTo: null }).where(sql`${lots.id} = ${input.lotId} and ${lots.partyId} = ${original.partyId} and ${lots.inTransitTo} = ${original.counterpartyId}`).run().changes;
      if (withdrawn === 0) throw new AppError("conflict", { key: "errors.movedSince", values: { code: lotCode(tx, input.lotId) } });
    } else if (input.use === "draw" || input.use === "loss") {
      tx.update(lots).set({ onHand: sql`${lots.onHand} + ${input.quantity}` }).where(eq(lots.id, input.lotId)).run();
      tx.insert(eventOutputs).values({ eventId: correctionId, lotId: input.lotId, quantity: input.quantity, content: input.content }).run();
    } else if (input.use === "move" && input.previousPartyId) {
      const lot = tx.select().from(lots).where(eq(lots.id, input.lotId)).get()!;
      if (lot.partyId !== destination) throw new AppError("conflict", { key: "errors.movedSince", values: { code: lot.code } });
      tx.insert(eventInputs).values({ eventId: correctionId, lotId: lot.id, quantity: lot.onHand, content: 0, use: "move", previousPartyId: lot.partyId }).run();
      tx.update(lots).set({ partyId: input.previousPartyId, ...(reopens ? { inTransitTo: original.partyId } : {}) }).where(eq(lots.id, lot.id)).run();
    }
  }
}

const lotCode = (tx: DbOrTx, id: number) => tx.select({ code: lots.code }).from(lots).where(eq(lots.id, id)).get()!.code;
