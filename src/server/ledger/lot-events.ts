import "server-only";
import { asc, eq, inArray, or } from "drizzle-orm";
import { alias } from "drizzle-orm/sqlite-core";
import { eventInputs, eventOutputs, events, lots, measurements, parties, users } from "@/db/schema";
import { showEvent } from "@/domain/event-view";
import { canSeeLot } from "@/domain/permissions";
import { getDb } from "../platform/db";
import { notFound } from "../platform/errors";
import { findLotId } from "./lots";
import type { SessionUser } from "../accounts/session";

const counterparty = alias(parties, "counterparty");
const ownerOf = { partyId: lots.partyId, originPartyId: lots.originPartyId, inTransitTo: lots.inTransitTo };

/**
 * Every event that drew from, added to, moved or measured a lot, oldest first, with its
 * corrections — as this reader may see them: another party's lot in the same event shows as
 * "another party's lot", with no code and no weight (src/domain/event-view.ts).
 */
export function listLotEvents(actor: SessionUser, code: string) {
  const lotId = findLotId(actor, code);
  if (lotId === null) throw notFound({ key: "errors.lotNotFound", values: { code } });
  const db = getDb();
  const touching = db
    .select({ id: eventInputs.eventId })
    .from(eventInputs)
    .where(eq(eventInputs.lotId, lotId))
    .union(db.select({ id: eventOutputs.eventId }).from(eventOutputs).where(eq(eventOutputs.lotId, lotId)))
    .union(db.select({ id: measurements.eventId }).from(measurements).where(eq(measurements.lotId, lotId)))
    .all()
    .map((r) => r.id);
  // A correction of one of these events belongs on the lot page too.
  const ids = [...new Set([...touching, ...db.select({ id: events.id }).from(events).where(inArray(events.corrects, touching.length ? touching : [-1])).all().map((r) => r.id)])];
  return loadEvents(ids).map(({ inputs, outputs, measurements, attributes, ...e }) => ({
    ...e,
    ...showEvent({ inputs, outputs, measurements, attributes }, (lot) => canSeeLot(actor, lot)),
  }));
}
export type ShownLotEvent = ReturnType<typeof listLotEvents>[number];

/** Events in full, every lot named: for readers of all records only (recall, EPCIS, brew days). */
export function describeEvents(ids: number[]) {
  return loadEvents(ids).map(({ inputs, outputs, measurements, ...e }) => ({
    ...e,
    inputs: inputs.map(({ owner: _o, ...i }) => i),
    outputs: outputs.map(({ owner: _o, ...o }) => o),
    measurements: measurements.map(({ owner: _o, ...m }) => m),
  }));
}

/** The events with, on each lot they name, whose it is. */
function loadEvents(ids: number[]) {
  if (ids.length === 0) return [];
  const db = getDb();
  const rows = db
    .select({ event: events, userName: users.name, partyName: parties.name, counterpartyName: counterparty.name })
    .from(events)
    .innerJoin(users, eq(users.id, events.userId))
    .innerJoin(parties, eq(parties.id, events.partyId))
    .leftJoin(counterparty, eq(counterparty.id, events.counterpartyId))
    .where(inArray(events.id, ids))
    .orderBy(asc(events.at), asc(events.id))
    .all();
  const ins = db.select({ eventId: eventInputs.eventId, code: lots.code, quantity: eventInputs.quantity, unit: lots.unit, use: eventInputs.use, owner: ownerOf }).from(eventInputs).innerJoin(lots, eq(lots.id, eventInputs.lotId)).where(inArray(eventInputs.eventId, ids)).all();
  const outs = db.select({ eventId: eventOutputs.eventId, code: lots.code, kind: lots.kind, quantity: eventOutputs.quantity, unit: lots.unit, owner: ownerOf }).from(eventOutputs).innerJoin(lots, eq(lots.id, eventOutputs.lotId)).where(inArray(eventOutputs.eventId, ids)).all();
  const ms = db
    .select({ eventId: measurements.eventId, name: measurements.name, value: measurements.value, unit: measurements.unit, owner: { partyId: lots.partyId, originPartyId: lots.originPartyId, inTransitTo: lots.inTransitTo } })
    .from(measurements)
    .leftJoin(lots, eq(lots.id, measurements.lotId))
    .where(inArray(measurements.eventId, ids))
    .all();
  const correctedBy = new Map(
    db.select({ id: events.id, corrects: events.corrects }).from(events).where(or(inArray(events.corrects, ids))).all().map((r) => [r.corrects!, r.id]),
  );
  return rows.map(({ event: e, userName, partyName, counterpartyName }) => ({
    id: e.id,
    step: e.step,
    at: e.at.toISOString(),
    recordedAt: e.recordedAt.toISOString(),
    user: { id: e.userId, name: userName },
    party: { id: e.partyId, name: partyName },
    counterparty: e.counterpartyId ? { id: e.counterpartyId, name: counterpartyName ?? "" } : null,
    place: e.place,
    referenceDoc: e.referenceDoc,
    note: e.note,
    corrects: e.corrects,
    correctedBy: correctedBy.get(e.id) ?? null,
    reason: e.reason,
    attributes: JSON.parse(e.attributes) as Record<string, unknown>,
    inputs: ins.filter((i) => i.eventId === e.id).map(({ code, quantity, unit, use, owner }) => ({ lot: code, quantity, unit, use, owner })),
    outputs: outs.filter((o) => o.eventId === e.id).map(({ code, kind, quantity, unit, owner }) => ({ lot: code, kind, quantity, unit, owner })),
    measurements: ms.filter((m) => m.eventId === e.id).map(({ name, value, unit, owner }) => ({ name, value, unit, owner })),
  }));
}
export type LotEvent = ReturnType<typeof describeEvents>[number];
