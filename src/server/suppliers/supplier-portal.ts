import "server-only";
import { and, asc, eq, inArray, sql, type SQL } from "drizzle-orm";
import { lots, parties } from "@/db/schema";
import { can } from "@/domain/permissions";
import { getDb } from "../platform/db";
import { forbidden } from "../platform/errors";
import { listFields } from "../ledger/fields";
import type { SessionUser } from "../accounts/session";
import { ledgerOf } from "./supplier-ledger";
import { listStatements } from "./supplier-statements";
import { traceForward } from "../trace/trace";

/*
 * What growers and mills see of their own business. Every query here is bound to one party
 * in its WHERE clause: the portal functions take it from the session, never from the request,
 * so a grower cannot name another grower's lots, prices or money.
 */

export type Delivery = { eventId: number; at: Date; slip: string; receiver: string; code: string; variety: string | null; cropYear: number | null; grade: string | null; kg: number; amountYen: number | null; reversed: boolean };

/** Receipts of a grower's harvest lots, with what each delivery was priced at (null: no contract price). */
export function deliveriesOf(growerId: string): Delivery[] {
  return getDb()
    .all<Omit<Delivery, "at" | "reversed"> & { at: number; reversed: number }>(sql`
      select e.id as eventId, e.at, e.reference_doc as slip, r.name as receiver, l.code, l.variety, l.crop_year as cropYear, l.grade, i.quantity as kg,
        (select s.amount_yen from supplier_entries s where s.event_id = e.id and s.lot_id = l.id and s.kind = 'delivery') as amountYen,
        exists(select 1 from events c where c.corrects = e.id) as reversed
      from events e
      join event_inputs i on i.event_id = e.id and i.use = 'move'
      join lots l on l.id = i.lot_id
      join parties r on r.id = e.party_id
      where e.step = 'receiving' and e.counterparty_id = ${growerId} and l.kind = 'harvest' and l.origin_party_id = ${growerId}
      order by e.at desc, e.id desc`)
    .map((r) => ({ ...r, at: new Date(r.at), reversed: Boolean(r.reversed) }));
}

export type Run = { eventId: number; at: Date; polished: string | null; brownKg: number; polishedKg: number; targetPct: number | null; achievedPct: number | null; feeYen: number | null; reversed: boolean };

/** A run's fee (null: no contract fee) and whether it was reversed: all a run's place in the list needs. */
const RUN_FEE = sql`(select s.amount_yen from supplier_entries s where s.event_id = e.id and s.kind = 'polishing-fee')`;
const RUN_REVERSED = sql`exists(select 1 from events c where c.corrects = e.id)`;

function runRows(where: SQL): Run[] {
  return getDb()
    .all<Omit<Run, "at" | "reversed"> & { at: number; reversed: number }>(sql`
      select e.id as eventId, e.at,
        (select l.code from event_outputs o join lots l on l.id = o.lot_id where o.event_id = e.id and l.kind = 'polished') as polished,
        json_extract(e.attributes, '$.brownKg') as brownKg, json_extract(e.attributes, '$.polishedKg') as polishedKg,
        json_extract(e.attributes, '$.targetPolishingRatioPct') as targetPct, json_extract(e.attributes, '$.achievedPolishingRatioPct') as achievedPct,
        ${RUN_FEE} as feeYen, ${RUN_REVERSED} as reversed
      from events e
      where ${where}
      order by e.at desc, e.id desc`)
    .map((r) => ({ ...r, at: new Date(r.at), reversed: Boolean(r.reversed) }));
}

/** A mill's polishing runs with the fee each one earned (null: no contract fee), newest first. */
export function runsOf(millId: string): Run[] {
  return runRows(sql`e.step = 'polishing' and e.party_id = ${millId}`);
}

export type RunKey = Pick<Run, "eventId" | "feeYen" | "reversed">;

/**
 * The same runs, in the same order, with only what places them in the list: a page of the
 * account then reads its 25 runs in full (`runsWithIds`) instead of all of a mill's (1,535 at
 * the bench's mill; most of that read was the runs' figures, pulled out of each run's JSON).
 */
export function runKeysOf(millId: string): RunKey[] {
  return getDb()
    .all<{ eventId: number; feeYen: number | null; reversed: number }>(sql`
      select e.id as eventId, ${RUN_FEE} as feeYen, ${RUN_REVERSED} as reversed
      from events e
      where e.step = 'polishing' and e.party_id = ${millId}
      order by e.at desc, e.id desc`)
    .map((r) => ({ ...r, reversed: Boolean(r.reversed) }));
}

/** Runs in full, in the order of `keys` (a page of `runKeysOf`); a key that names no polishing run gives nothing. */
export function runsWithIds(keys: readonly RunKey[]): Run[] {
  if (!keys.length) return [];
  const byId = new Map(runRows(sql`e.step = 'polishing' and e.id in (select value from json_each(${JSON.stringify(keys.map((k) => k.eventId))}))`).map((r) => [r.eventId, r]));
  return keys.flatMap((k) => byId.get(k.eventId) ?? []);
}

export type Receipt = { eventId: number; at: Date; code: string; kind: string; variety: string | null; grade: string | null; quantity: number; unit: string; from: string | null; slip: string; reversed: boolean };

/** Lots a mill took in, and from whom. */
export function receiptsAt(millId: string): Receipt[] {
  return getDb()
    .all<Omit<Receipt, "at" | "reversed"> & { at: number; reversed: number }>(sql`
      select e.id as eventId, e.at, l.code, l.kind, l.variety, l.grade, i.quantity, l.unit, p.name as "from", e.reference_doc as slip,
        exists(select 1 from events c where c.corrects = e.id) as reversed
      from events e
      join event_inputs i on i.event_id = e.id and i.use = 'move'
      join lots l on l.id = i.lot_id
      left join parties p on p.id = e.counterparty_id
      where e.step = 'receiving' and e.party_id = ${millId}
      order by e.at desc, e.id desc`)
    .map((r) => ({ ...r, at: new Date(r.at), reversed: Boolean(r.reversed) }));
}

export type Destination = { code: string; kind: string; fraction: number; name: string | null; at: Date };
export type HarvestTrail = { code: string; variety: string | null; cropYear: number | null; grade: string | null; kg: number; field: string | null; destinations: Destination[] };

/** A grower's harvest lots and the tanks and bottlings each reached, with the share of each that is this rice. */
export function harvestTrails(actor: SessionUser): HarvestTrail[] {
  const db = getDb();
  const harvests = db
    .select({ code: lots.code, variety: lots.variety, cropYear: lots.cropYear, grade: lots.grade, kg: lots.quantityIn, field: sql<string | null>`(select name from fields f where f.id = ${lots.fieldId})` })
    .from(lots)
    .where(and(eq(lots.kind, "harvest"), eq(lots.originPartyId, actor.partyId)))
    .orderBy(asc(lots.id))
    .all();
  return harvests.map((h) => {
    const reached = traceForward(actor, h.code).reached.filter((r) => r.kind === "tank" || r.kind === "bottled");
    const info = reached.length
      ? new Map(db.select({ code: lots.code, attributes: lots.attributes, createdAt: lots.createdAt }).from(lots).where(inArray(lots.code, reached.map((r) => r.code))).all().map((l) => [l.code, l]))
      : new Map();
    const destinations = reached.map((r) => {
      const l = info.get(r.code);
      const a = JSON.parse(l?.attributes ?? "{}") as { tankName?: string; bottleMl?: number };
      return { code: r.code, kind: r.kind, fraction: r.fraction, name: a.tankName ?? (a.bottleMl ? `${a.bottleMl} mL` : null), at: l?.createdAt ?? new Date(0) };
    });
    return { ...h, destinations };
  });
}

function ownParty(actor: SessionUser, kind: "grower" | "mill") {
  if (!can(actor, "ledger:read-own")) throw forbidden();
  const party = getDb().select().from(parties).where(eq(parties.id, actor.partyId)).get();
  if (party?.kind !== kind) throw forbidden();
  return party;
}

export function growerPortal(actor: SessionUser) {
  const party = ownParty(actor, "grower");
  const ledger = ledgerOf(getDb(), party.id);
  return {
    party: { id: party.id, name: party.name, invoiceNumber: party.invoiceNumber },
    fields: listFields(actor).map(({ id, name, region, areaHa }) => ({ id, name, region, areaHa })),
    harvests: harvestTrails(actor),
    deliveries: deliveriesOf(party.id),
    ledger,
    statements: listStatements(party.id),
  };
}

export function millPortal(actor: SessionUser) {
  const party = ownParty(actor, "mill");
  return {
    party: { id: party.id, name: party.name, invoiceNumber: party.invoiceNumber },
    receipts: receiptsAt(party.id),
    runs: runKeysOf(party.id),
    ledger: ledgerOf(getDb(), party.id),
    statements: listStatements(party.id),
  };
}
