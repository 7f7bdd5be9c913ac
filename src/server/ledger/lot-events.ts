import "server-only";
import { asc, eq, inArray, sql } from "drizzle-orm";
import { eventInputs, eventOutputs, events, lots, measurements } from "@/db/schema";
import { showEvent } from "@/domain/event-view";
import { canSeeLot } from "@/domain/permissions";
import { getDb } from "../platform/db";
import { notFound } from "../platform/errors";
import { findLotId } from "./lots";
import type { SessionUser } from "../accounts/session";

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
  return loadEvents(ids, OWNED).map(({ inputs, outputs, measurements, attributes, ...e }) => ({
    ...e,
    ...showEvent({ inputs, outputs, measurements, attributes }, (lot) => canSeeLot(actor, lot)),
  }));
}
export type ShownLotEvent = ReturnType<typeof listLotEvents>[number];

/** Events in full, every lot named: for readers of all records only (recall, EPCIS, brew days). */
export function describeEvents(ids: number[]) {
  return loadEvents(ids, NAMED);
}

type Lot = typeof lots.$inferSelect;
type Owner = Pick<Lot, "partyId" | "originPartyId" | "inTransitTo">;
type EventRow = { id: number; step: (typeof events.$inferSelect)["step"]; at: number; recordedAt: number; userId: string; userName: string; partyId: string; partyName: string; counterpartyId: string | null; counterpartyName: string | null; place: string; referenceDoc: string; note: string; corrects: number | null; reason: string; attributes: string };
type LineRow = { eventId: number; code: string; kind: Lot["kind"]; quantity: number; unit: Lot["unit"]; use: (typeof eventInputs.$inferSelect)["use"] } & Owner;

type MeasurementRow = { eventId: number; name: string; value: number; unit: string; owner: Owner | null };
/** How each line of an event is built: with whose lot it is (to hide another party's), or without. */
type Shape<I, O, M> = { input: (r: LineRow) => I; output: (r: LineRow) => O; measurement: (r: MeasurementRow) => M };

const ownerOfRow = ({ partyId, originPartyId, inTransitTo }: Owner): Owner => ({ partyId, originPartyId, inTransitTo });
const OWNED = {
  input: (i: LineRow) => ({ lot: i.code, quantity: i.quantity, unit: i.unit, use: i.use, owner: ownerOfRow(i) }),
  output: (o: LineRow) => ({ lot: o.code, kind: o.kind, quantity: o.quantity, unit: o.unit, owner: ownerOfRow(o) }),
  measurement: ({ name, value, unit, owner }: MeasurementRow) => ({ name, value, unit, owner }),
};
const NAMED = {
  input: (i: LineRow) => ({ lot: i.code, quantity: i.quantity, unit: i.unit, use: i.use }),
  output: (o: LineRow) => ({ lot: o.code, kind: o.kind, quantity: o.quantity, unit: o.unit }),
  measurement: ({ name, value, unit }: MeasurementRow) => ({ name, value, unit }),
};

/** Rows grouped by their event, in the order read. */
function byEvent<T extends { eventId: number }>(rows: T[]): Map<number, T[]> {
  const out = new Map<number, T[]>();
  for (const r of rows) (out.get(r.eventId) ?? out.set(r.eventId, []).get(r.eventId)!).push(r);
  return out;
}

/**
 * The events with, on each lot they name, whose it is. Plain SQL with the ids as one JSON
 * parameter, and lines grouped by event once: a recall reads thousands of events at a time.
 */
function loadEvents<I, O, M>(ids: number[], shape: Shape<I, O, M>) {
  if (ids.length === 0) return [];
  const db = getDb();
  const list = JSON.stringify(ids);
  const rows = db.all<EventRow>(sql`
    select e.id, e.step, e.at, e.recorded_at as recordedAt, e.user_id as userId, u.name as userName, e.party_id as partyId, p.name as partyName,
      e.counterparty_id as counterpartyId, c.name as counterpartyName, e.place, e.reference_doc as referenceDoc, e.note, e.corrects, e.reason, e.attributes
    from events e join users u on u.id = e.user_id join parties p on p.id = e.party_id left join parties c on c.id = e.counterparty_id
    where e.id in (select value from json_each(${list}))
    order by e.at, e.id`);
  const owner = sql.raw("l.party_id as partyId, l.origin_party_id as originPartyId, l.in_transit_to as inTransitTo");
  const ins = byEvent(db.all<LineRow>(sql`
    select i.event_id as eventId, l.code, i.quantity, l.unit, i.use, ${owner}
    from event_inputs i join lots l on l.id = i.lot_id where i.event_id in (select value from json_each(${list})) order by i.event_id, i.id`));
  const outs = byEvent(db.all<LineRow>(sql`
    select o.event_id as eventId, l.code, l.kind, o.quantity, l.unit, ${owner}
    from event_outputs o join lots l on l.id = o.lot_id where o.event_id in (select value from json_each(${list})) order by o.event_id, o.id`));
  const ms = byEvent(
    db
      .select({ eventId: measurements.eventId, name: measurements.name, value: measurements.value, unit: measurements.unit, owner: ownerOf })
      .from(measurements)
      .leftJoin(lots, eq(lots.id, measurements.lotId))
      .where(inArray(measurements.eventId, ids))
      .orderBy(asc(measurements.eventId), asc(measurements.id))
      .all(),
  );
  const correctedBy = new Map(
    db.all<{ id: number; corrects: number }>(sql`select id, corrects from events where corrects in (select value from json_each(${list}))`).map((r) => [r.corrects, r.id]),
  );
  return rows.map((e) => ({
    id: e.id,
    step: e.step,
    at: new Date(e.at).toISOString(),
    recordedAt: new Date(e.recordedAt).toISOString(),
    user: { id: e.userId, name: e.userName },
    party: { id: e.partyId, name: e.partyName },
    counterparty: e.counterpartyId ? { id: e.counterpartyId, name: e.counterpartyName ?? "" } : null,
    place: e.place,
    referenceDoc: e.referenceDoc,
    note: e.note,
    corrects: e.corrects,
    correctedBy: correctedBy.get(e.id) ?? null,
    reason: e.reason,
    attributes: JSON.parse(e.attributes) as Record<string, unknown>,
    inputs: (ins.get(e.id) ?? []).map(shape.input),
    outputs: (outs.get(e.id) ?? []).map(shape.output),
    measurements: (ms.get(e.id) ?? []).map(shape.measurement),
  }));
}
export type LotEvent = ReturnType<typeof describeEvents>[number];
