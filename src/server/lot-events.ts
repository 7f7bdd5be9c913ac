import "server-only";
import { asc, eq, inArray, or } from "drizzle-orm";
import { alias } from "drizzle-orm/sqlite-core";
import { eventInputs, eventOutputs, events, lots, measurements, parties, users } from "@/db/schema";
import { getDb } from "./db";
import { notFound } from "./errors";
import { findLotId } from "./lots";
import type { SessionUser } from "./session";

const counterparty = alias(parties, "counterparty");

/** Every event that drew from, added to, moved or measured a lot, oldest first, with its corrections. */
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
  return describeEvents(ids);
}

export function describeEvents(ids: number[]) {
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
  const ins = db.select({ eventId: eventInputs.eventId, code: lots.code, quantity: eventInputs.quantity, unit: lots.unit, use: eventInputs.use }).from(eventInputs).innerJoin(lots, eq(lots.id, eventInputs.lotId)).where(inArray(eventInputs.eventId, ids)).all();
  const outs = db.select({ eventId: eventOutputs.eventId, code: lots.code, kind: lots.kind, quantity: eventOutputs.quantity, unit: lots.unit }).from(eventOutputs).innerJoin(lots, eq(lots.id, eventOutputs.lotId)).where(inArray(eventOutputs.eventId, ids)).all();
  const ms = db.select({ eventId: measurements.eventId, name: measurements.name, value: measurements.value, unit: measurements.unit }).from(measurements).where(inArray(measurements.eventId, ids)).all();
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
    inputs: ins.filter((i) => i.eventId === e.id).map(({ code, quantity, unit, use }) => ({ lot: code, quantity, unit, use })),
    outputs: outs.filter((o) => o.eventId === e.id).map(({ code, kind, quantity, unit }) => ({ lot: code, kind, quantity, unit })),
    measurements: ms.filter((m) => m.eventId === e.id).map(({ name, value, unit }) => ({ name, value, unit })),
  }));
}
export type LotEvent = ReturnType<typeof describeEvents>[number];
