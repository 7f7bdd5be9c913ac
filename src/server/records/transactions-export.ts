import "server-only";
import { and, asc, eq, gte, inArray, isNull, lt, or, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/sqlite-core";
import { eventInputs, events, lots, parties, users } from "@/db/schema";
import { can } from "@/domain/permissions";
import { dayIn, nextDay, startOfDayIn } from "@/i18n/dates";
import { csvText, dateRangeSchema } from "@/lib/validation/csv";
import { fieldErrorsFrom, type Translate } from "@/lib/validation/field-errors";
import { getDb } from "../platform/db";
import { breweryTimeZone } from "../platform/settings";
import { invalid } from "../platform/errors";
import type { SessionUser } from "../accounts/session";

export type DateRange = { from: string; to: string };

/** `from` and `to` as calendar days (YYYY-MM-DD), `from` not after `to`; else 422 with field errors. */
export function parseDateRange(query: { from?: string | null; to?: string | null }, t: Translate): DateRange {
  const parsed = dateRangeSchema.safeParse({ from: query.from ?? undefined, to: query.to ?? undefined });
  if (!parsed.success) throw invalid(fieldErrorsFrom(parsed.error, t));
  if (parsed.data.from > parsed.data.to) throw invalid({ to: [t("csv.records.rangeOrder")] });
  return parsed.data;
}

export type TransactionRecord = {
  date: string;
  direction: "receipt" | "shipment";
  reversal: boolean;
  product: string;
  lot: string;
  origin: string;
  quantity: number;
  unit: string;
  party: string;
  counterparty: string;
  place: string;
  deliverySlip: string;
  recordedBy: string;
  eventId: number;
  reversesEventId: number | null;
  /** A receipt of a dispatch: the slip's quantity and what was short on arrival (slip − arrival). */
  slipQuantity: number | null;
  shortfall: number | null;
};

const original = alias(events, "original");
const holder = alias(parties, "holder");
const other = alias(parties, "other");
const MOVES = ["receiving", "shipping"] as const;

/**
 * The rice traceability law's record of receipts and shipments (MAFF, 米トレーサビリティ法):
 * one line per lot per receipt or shipment in the range, and per correction reversing one —
 * what, where it was grown, how much, when, with whom, and where. A reversal repeats the
 * lines of the event it undoes with the quantity negated.
 */
export function listTransactionRecords(actor: SessionUser, range: DateRange, t: Translate): TransactionRecord[] {
  // A reversal belongs to the parties of the event it reverses, and lists that event's lots.
  const source = sql`coalesce(${original.id}, ${events.id})`;
  const party = sql`coalesce(${original.partyId}, ${events.partyId})`;
  // Days are the brewery's calendar days (its time zone setting), from the start of `from` to the end of `to`.
  const zone = breweryTimeZone();
  const own = can(actor, "records:read-all") ? undefined : or(sql`${party} = ${actor.partyId}`, eq(events.counterpartyId, actor.partyId));
  const rows = getDb()
    .select({
      at: events.at,
      step: events.step,
      originalStep: original.step,
      eventId: events.id,
      reverses: original.id,
      lotId: lots.id,
      code: lots.code,
      kind: lots.kind,
      variety: lots.variety,
      unit: lots.unit,
      quantity: eventInputs.quantity,
      party: holder.name,
      counterparty: other.name,
      place: sql<string>`coalesce(${original.place}, ${events.place})`,
      deliverySlip: sql<string>`coalesce(${original.referenceDoc}, ${events.referenceDoc})`,
      recordedBy: users.name,
      attributes: sql<string>`coalesce(${original.attributes}, ${events.attributes})`,
    })
    .from(events)
    .leftJoin(original, eq(original.id, events.corrects))
    // The shortfall a receipt found is its own figure on the receipt's line, not a line of its own.
    .innerJoin(eventInputs, sql`${eventInputs.eventId} = ${source} and ${eventInputs.use} <> 'loss'`)
    .innerJoin(lots, eq(lots.id, eventInputs.lotId))
    .innerJoin(holder, sql`${holder.id} = ${party}`)
    .leftJoin(other, eq(other.id, events.counterpartyId))
    .innerJoin(users, eq(users.id, events.userId))
    .where(
      and(
        or(and(inArray(events.step, MOVES), isNull(events.corrects)), and(eq(events.step, "correcting"), inArray(original.step, MOVES))),
        gte(events.at, startOfDayIn(range.from, zone)),
        lt(events.at, startOfDayIn(nextDay(range.to), zone)),
        own,
      ),
    )
    .orderBy(asc(events.at), asc(events.id), asc(eventInputs.id))
    .all();
  const origins = new Map<number, string>();
  return rows.map((r) => {
    const reversal = r.step === "correcting";
    const kind = t(`lot.kinds.${r.kind}`);
    if (!origins.has(r.lotId)) origins.set(r.lotId, originOf(r.lotId, t));
    const { slipQuantity, shortfall } = JSON.parse(r.attributes) as { slipQuantity?: number; shortfall?: number };
    const sign = reversal ? -1 : 1;
    return {
      date: dayIn(r.at, zone),
      direction: (reversal ? r.originalStep : r.step) === "receiving" ? "receipt" : "shipment",
      reversal,
      product: r.variety ? t("csv.records.product", { kind, variety: r.variety }) : kind,
      lot: r.code,
      origin: origins.get(r.lotId)!,
      quantity: reversal ? -r.quantity : r.quantity,
      unit: r.unit,
      party: r.party,
      counterparty: r.counterparty ?? "",
      place: r.place,
      deliverySlip: r.deliverySlip,
      recordedBy: r.recordedBy,
      eventId: r.eventId,
      reversesEventId: r.reverses,
      slipQuantity: typeof slipQuantity === "number" ? sign * slipQuantity : null,
      shortfall: typeof shortfall === "number" ? sign * shortfall : null,
    };
  });
}

/**
 * Where a lot's rice was grown: the prefectures of the fields of the harvest lots it came
 * from, heaviest share first, as the law asks of several origins; "domestic" where a field
 * names none. Shares follow the lineage edges back (reversed edges cancel in the sum).
 */
function originOf(lotId: number, t: Translate): string {
  const rows = getDb().all<{ region: string | null; share: number }>(sql`
    with recursive source(lot_id, share, depth) as (
      select ${lotId}, 1.0, 0
      union all
      select e.parent_lot_id, s.share * e.weight / c.content_in, s.depth + 1
      from source s join lineage_edges e on e.child_lot_id = s.lot_id join lots c on c.id = s.lot_id
      where c.content_in > 0 and s.depth < 32
    )
    select trim(f.region) as region, sum(s.share) as share
    from source s join lots l on l.id = s.lot_id left join fields f on f.id = l.field_id
    where l.kind = 'harvest'
    group by trim(f.region)
    having sum(s.share) > 1e-9
    order by share desc`);
  const domestic = t("csv.records.domestic");
  const names = [...new Set(rows.map((r) => r.region || domestic))];
  return names.length ? names.join(", ") : domestic;
}

const COLUMNS = ["date", "direction", "entry", "product", "lot", "origin", "quantity", "unit", "party", "counterparty", "place", "deliverySlip", "recordedBy", "event", "reverses", "slipQuantity", "shortfall"] as const;

export function transactionsCsv(records: TransactionRecord[], t: Translate): string {
  return csvText(
    COLUMNS.map((c) => t(`csv.records.columns.${c}`)),
    records.map((r) => [
      r.date,
      t(`csv.records.directions.${r.direction}`),
      t(r.reversal ? "csv.records.entries.reversal" : "csv.records.entries.record"),
      r.product,
      r.lot,
      r.origin,
      r.quantity,
      r.unit,
      r.party,
      r.counterparty,
      r.place,
      r.deliverySlip,
      r.recordedBy,
      r.eventId,
      r.reversesEventId ?? "",
      r.slipQuantity ?? "",
      r.shortfall ?? "",
    ]),
  );
}
