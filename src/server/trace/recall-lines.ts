import "server-only";
import { sql } from "drizzle-orm";
import { timeAtOffset } from "@/domain/epcis-vocabulary";
import { getDb } from "../platform/db";
import { forbidden } from "../platform/errors";
import { canReadRecall, sortRecallRows, type RecallEntry, type RecallRow } from "./recall";
import { descendantsOf, traceHead } from "./trace";
import type { SessionUser } from "../accounts/session";

type Line = {
  eventId: number;
  at: number;
  step: string;
  place: string;
  referenceDoc: string;
  corrects: number | null;
  correctedBy: number | null;
  reason: string;
  partyName: string;
  partyAddress: string;
  counterpartyName: string | null;
  counterpartyKind: string | null;
  recordedBy: string;
  lot: string;
  kind: string;
  variety: string | null;
  unit: string;
  quantity: number;
  use: string | null;
  output: 0 | 1;
  created: 0 | 1 | null;
};

const round = (x: number, places: number) => Math.round(x * 10 ** places) / 10 ** places;

/**
 * The recall spreadsheet's lines straight from SQLite: the same lines as
 * `recallRows(loadRecall(…))` (tests/integration/recall-reference.test.ts compares them), without
 * describing every event in full first — a harvest lot can reach thousands of events, and the
 * spreadsheet needs only their lines on the reached lots.
 */
export function recallLines(actor: SessionUser, code: string): RecallRow[] {
  if (!canReadRecall(actor)) throw forbidden();
  return getDb().transaction((tx) => {
    const head = traceHead(actor, code);
    const fractions = new Map<string, number>([[head.code, 1], ...descendantsOf(head).map((r) => [r.code, r.fraction] as const)]);
    // Inputs before outputs, each in the order recorded: the order recallRows writes an event's lines in.
    const lines = tx.all<Line>(sql`
      with reached(id) as (select id from lots where code in (select value from json_each(${JSON.stringify([...fractions.keys()])}))),
      lines(event_id, lot_id, quantity, use, output, line) as (
        select event_id, lot_id, quantity, use, 0, id from event_inputs where lot_id in reached and use <> 'observe'
        union all select event_id, lot_id, quantity, null, 1, id from event_outputs where lot_id in reached
      ),
      created(lot_id, event_id) as (
        select o.lot_id, min(o.event_id) from event_outputs o join events e on e.id = o.event_id
        where o.lot_id in reached and e.step <> 'correcting' group by o.lot_id
      )
      select e.id as eventId, e.at, e.step, e.place, e.reference_doc as referenceDoc, e.corrects, e.reason,
        p.name as partyName, p.address as partyAddress, c.name as counterpartyName, c.kind as counterpartyKind, u.name as recordedBy,
        (select k.id from events k where k.corrects = e.id) as correctedBy,
        l.code as lot, l.kind, l.variety, l.unit, x.quantity, x.use, x.output, created.event_id = e.id as created
      from lines x
      join events e on e.id = x.event_id
      join lots l on l.id = x.lot_id
      join parties p on p.id = e.party_id
      join users u on u.id = e.user_id
      left join parties c on c.id = e.counterparty_id
      left join created on created.lot_id = x.lot_id
      where e.step <> 'measuring'
      order by e.at, e.id, x.output, x.line`);
    const at = new Map<number, string>();
    const rows = lines.map((x): RecallRow => ({
      at: at.get(x.at) ?? (at.set(x.at, timeAtOffset(new Date(x.at))), at.get(x.at)!),
      lot: x.lot,
      kind: x.kind,
      variety: x.variety,
      quantity: round(x.quantity, 3),
      unit: x.unit,
      entry: entryOf(x),
      step: x.step,
      location: x.place || [x.partyName, x.partyAddress].filter(Boolean).join(", "),
      counterparty: x.counterpartyName ?? "",
      toBuyer: x.step === "shipping" && x.counterpartyKind === "buyer",
      referenceDoc: x.referenceDoc,
      fraction: round(fractions.get(x.lot)!, 6),
      party: x.partyName,
      recordedBy: x.recordedBy,
      eventId: x.eventId,
      corrects: x.corrects,
      correctedBy: x.correctedBy,
      reason: x.reason,
    }));
    return sortRecallRows(rows);
  });
}

/** What the line did to the lot, as recallRows names it. */
function entryOf(x: Line): RecallEntry {
  const correction = x.step === "correcting";
  if (x.output) return correction ? "returned" : x.created ? "created" : "added";
  if (correction) return x.use === "move" ? "movedBack" : "takenBack";
  return x.step === "receiving" ? "received" : x.step === "shipping" ? "shipped" : x.use === "move" ? "moved" : "drawn";
}
