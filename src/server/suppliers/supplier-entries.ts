import "server-only";
import { and, desc, eq, isNull } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { eventOutputs, events, lots, measurements, parties, supplierEntries } from "@/db/schema";
import type { PartyKind } from "@/domain/roles";
import { deliveryPrice, polishingFee, priceForGrade } from "@/domain/supplier-prices";
import { TAX_RATES } from "@/domain/tax";
import { currentGrowerContract, currentMillContract } from "./supplier-contracts";

type Lot = typeof lots.$inferSelect;
export type SupplierHookContext = {
  eventId: number;
  step: string;
  eventParty: string;
  counterparty: { id: string; kind: PartyKind } | null;
  draws: { lot: Lot; quantity: number; use: string }[];
  at: Date;
};

type EventRow = typeof events.$inferSelect;
const eventRow = (tx: DbOrTx, id: number): EventRow => tx.select().from(events).where(eq(events.id, id)).get()!;

/**
 * Called inside the transaction that records an event, after its outputs are written: a
 * receipt of a grower's harvest lot owes the grower the contract price, a polishing run at a
 * mill owes the mill its fee. Without a contract (or a price for the lot's grade) nothing is
 * owed yet and the receipt stands; the office sees it among deliveries without a price.
 */
export function recordSupplierEntries(tx: DbOrTx, c: SupplierHookContext): void {
  if (c.step === "receiving" && c.counterparty?.kind === "grower") recordDeliveries(tx, c, eventRow(tx, c.eventId), c.counterparty.id);
  if (c.step === "polishing") recordPolishingFee(tx, c, eventRow(tx, c.eventId));
}

function recordDeliveries(tx: DbOrTx, c: SupplierHookContext, event: EventRow, growerId: string) {
  const slip = event.referenceDoc;
  for (const d of c.draws) {
    if (d.use !== "move" || d.lot.kind !== "harvest" || d.lot.originPartyId !== growerId) continue;
    const contract = currentGrowerContract(tx, growerId, d.lot.variety, d.lot.cropYear);
    const pricePerBagYen = contract ? priceForGrade(contract.terms, d.lot.grade) : null;
    if (!contract || pricePerBagYen === null) continue;
    const moisturePct = latestMoisture(tx, d.lot);
    const p = deliveryPrice(pricePerBagYen, d.quantity, moisturePct, contract.terms.moisture);
    tx.insert(supplierEntries)
      .values({
        partyId: growerId,
        kind: "delivery",
        at: c.at,
        amountYen: p.amountYen,
        // Rice is food: the reduced rate.
        taxRatePct: TAX_RATES.reduced,
        eventId: c.eventId,
        contractId: contract.id,
        lotId: d.lot.id,
        detail: JSON.stringify({ kg: d.quantity, bags: p.bags, grade: d.lot.grade, variety: d.lot.variety, cropYear: d.lot.cropYear, moisturePct, pricePerBagYen, moistureSteps: p.steps, deductionPerBagYen: p.deductionPerBagYen, contractVersion: contract.version, slip }),
        reference: slip,
        userId: event.userId,
        recordedAt: new Date(),
      })
      .run();
  }
}

/** The mill's own reading at receipt counts over the grower's declared figure. */
function latestMoisture(tx: DbOrTx, lot: Lot): number | null {
  const measured = tx
    .select({ value: measurements.value })
    .from(measurements)
    .where(and(eq(measurements.lotId, lot.id), eq(measurements.name, "moisturePct")))
    .orderBy(desc(measurements.id))
    .get();
  return measured?.value ?? lot.moisturePct;
}

function recordPolishingFee(tx: DbOrTx, c: SupplierHookContext, event: EventRow) {
  const mill = tx.select({ kind: parties.kind }).from(parties).where(eq(parties.id, c.eventParty)).get();
  if (mill?.kind !== "mill") return;
  const contract = currentMillContract(tx, c.eventParty);
  if (!contract) return;
  const attributes = JSON.parse(event.attributes) as { targetPolishingRatioPct?: number };
  const target = attributes.targetPolishingRatioPct;
  const brownKg = c.draws.filter((d) => d.use === "draw").reduce((a, d) => a + d.quantity, 0);
  if (typeof target !== "number" || !(brownKg > 0)) return;
  const fee = polishingFee(contract.terms, target, brownKg);
  if (!fee) return;
  const polished = tx
    .select({ id: lots.id, code: lots.code })
    .from(eventOutputs)
    .innerJoin(lots, eq(lots.id, eventOutputs.lotId))
    .where(and(eq(eventOutputs.eventId, c.eventId), eq(lots.kind, "polished")))
    .get();
  tx.insert(supplierEntries)
    .values({
      partyId: c.eventParty,
      kind: "polishing-fee",
      at: c.at,
      amountYen: fee.amountYen,
      // Polishing is a service: the standard rate.
      taxRatePct: TAX_RATES.standard,
      eventId: c.eventId,
      contractId: contract.id,
      lotId: polished?.id ?? null,
      detail: JSON.stringify({ brownKg, targetPolishingRatioPct: target, feePerKgYen: fee.feePerKgYen, upToRatioPct: fee.upToRatioPct, contractVersion: contract.version, inputs: c.draws.map((d) => d.lot.code) }),
      reference: polished?.code ?? "",
      userId: event.userId,
      recordedAt: new Date(),
    })
    .run();
}

/**
 * Called inside the transaction of a correction: every entry the corrected event made is
 * answered by an entry of the opposite amount at the same rate, pointing at it.
 */
export function reverseSupplierEntries(tx: DbOrTx, c: { correctionId: number; originalId: number }): void {
  const correction = eventRow(tx, c.correctionId);
  const made = tx
    .select()
    .from(supplierEntries)
    .where(and(eq(supplierEntries.eventId, c.originalId), isNull(supplierEntries.reversesEntryId)))
    .all();
  for (const e of made) {
    tx.insert(supplierEntries)
      .values({
        partyId: e.partyId,
        kind: "reversal",
        at: correction.at,
        amountYen: -e.amountYen,
        taxRatePct: e.taxRatePct,
        eventId: c.correctionId,
        reversesEntryId: e.id,
        contractId: e.contractId,
        lotId: e.lotId,
        detail: JSON.stringify({ reverses: e.kind }),
        reference: e.reference,
        reason: correction.reason,
        userId: correction.userId,
        recordedAt: new Date(),
      })
      .run();
  }
}
