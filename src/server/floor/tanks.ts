import "server-only";
import { and, asc, desc, eq, sql } from "drizzle-orm";
import { eventOutputs, events, lots } from "@/db/schema";
import { kojiRatioPct, waterRatioPct } from "@/domain/brewing";
import { ADDED_ALCOHOL_KG, ADDED_ALCOHOL_STRENGTH_PCT, REFERENCE_ALCOHOL_PCT } from "@/domain/categories";
import { roundPct } from "@/domain/polishing";
import { getDb } from "../platform/db";
import { notFound } from "../platform/errors";
import { findLot, findLotId, visibleTo } from "../ledger/lots";
import type { SessionUser } from "../accounts/session";

/**
 * Share of a lot's rice that passed through koji, on the dry basis: walk the lineage
 * back from the lot, stop at koji lots (and at the mill), add up the fractions that
 * end on koji. Reversed edges carry negative weights and cancel.
 */
export function kojiFraction(lotId: number): number {
  const row = getDb().get<{ f: number | null }>(sql`
    with recursive up(lot_id, frac) as (
      select ${lotId}, 1.0
      union all
      select e.parent_lot_id, up.frac * e.weight / c.content_in
      from up
      join lots c on c.id = up.lot_id
      join lineage_edges e on e.child_lot_id = up.lot_id
      where c.kind not in ('koji', 'polished', 'harvest') and c.content_in > 0
    )
    select sum(up.frac) as f from up join lots l on l.id = up.lot_id where l.kind = 'koji'`);
  return row?.f ?? 0;
}

/** Water (L) recorded with the starter and additions that went into a tank, pro rata where a starter was shared. */
function waterInto(tankId: number): number {
  const db = getDb();
  const direct = db.get<{ w: number | null }>(sql`
    select sum(m.value) as w from measurements m
    join event_outputs o on o.event_id = m.event_id
    join events e on e.id = m.event_id
    where o.lot_id = ${tankId} and m.name = 'waterL' and e.step = 'mash-addition' and m.lot_id is not null
      and not exists (select 1 from events c where c.corrects = e.id)`);
  const viaStarter = db.get<{ w: number | null }>(sql`
    select sum(m.value * edge.w / s.content_in) as w
    from (select parent_lot_id as starter_id, sum(weight) as w from lineage_edges where child_lot_id = ${tankId} group by parent_lot_id) edge
    join lots s on s.id = edge.starter_id and s.kind = 'starter'
    join event_outputs o on o.lot_id = s.id
    join measurements m on m.event_id = o.event_id and m.name = 'waterL'
    join events e on e.id = o.event_id and e.step = 'starter'`);
  return (direct?.w ?? 0) + (viaStarter?.w ?? 0);
}

/**
 * Distilled alcohol recorded on a tank, leaving out readings that were corrected: kg as added,
 * and kg converted to 95 % alcohol with the strength recorded beside it in the same event.
 * Readings from before the strength was recorded count as 95 %, the most they can weigh.
 */
export function addedAlcohol(tankId: number): { kg: number; kg95: number } {
  return addedAlcoholOf([tankId]).get(tankId) ?? { kg: 0, kg95: 0 };
}

/** The same for many tanks in one read (a blend's claims weigh every tank behind it). */
export function addedAlcoholOf(tankIds: number[]): Map<number, { kg: number; kg95: number }> {
  const rows = getDb().all<{ tank: number; kg: number | null; kg95: number | null }>(sql`
    select m.lot_id as tank, sum(m.value) as kg, sum(m.value * coalesce(s.value, ${REFERENCE_ALCOHOL_PCT}) / ${REFERENCE_ALCOHOL_PCT}) as kg95
    from measurements m join events e on e.id = m.event_id
    left join measurements s on s.event_id = m.event_id and s.lot_id = m.lot_id and s.name = ${ADDED_ALCOHOL_STRENGTH_PCT}
    where m.lot_id in (select value from json_each(${JSON.stringify(tankIds)})) and m.name = ${ADDED_ALCOHOL_KG}
      and not exists (select 1 from events c where c.corrects = e.id)
    group by m.lot_id`);
  return new Map(rows.map((r) => [r.tank, { kg: r.kg ?? 0, kg95: r.kg95 ?? 0 }]));
}

export function tankSummary(actor: SessionUser, code: string) {
  const id = findLotId(actor, code);
  if (id === null) throw notFound({ key: "errors.lotNotFound", values: { code } });
  const db = getDb();
  const tank = db.select().from(lots).where(eq(lots.id, id)).get()!;
  if (tank.kind !== "tank") throw notFound({ key: "errors.tankNotFound", values: { code } });
  const additionEvents = db
    .select({ id: events.id, at: events.at, attributes: events.attributes, corrected: sql<number>`exists (select 1 from events c where c.corrects = ${events.id})` })
    .from(events)
    .innerJoin(eventOutputs, and(eq(eventOutputs.eventId, events.id), eq(eventOutputs.lotId, id)))
    .where(eq(events.step, "mash-addition"))
    .orderBy(asc(events.at))
    .all();
  const additions = additionEvents.map((e) => {
    const a = JSON.parse(e.attributes) as Record<string, number | string | null>;
    return { eventId: e.id, at: e.at.toISOString(), corrected: Boolean(e.corrected), addition: a.addition as string, kojiKg: Number(a.kojiKg ?? 0), steamedKg: Number(a.steamedKg ?? 0), starterKg: Number(a.starterKg ?? 0), waterL: Number(a.waterL ?? 0), riceKg: Number(a.riceKg ?? 0) };
  });
  const totalRiceKg = tank.contentIn;
  const kojiRiceKg = kojiFraction(id) * totalRiceKg;
  const waterL = waterInto(id);
  const alcohol = addedAlcohol(id);
  return {
    code: tank.code,
    name: (JSON.parse(tank.attributes).tankName as string | undefined) ?? tank.code,
    onHandKg: tank.onHand,
    totalRiceKg,
    kojiRiceKg,
    kojiRatioPct: totalRiceKg > 0 ? roundPct(kojiRatioPct(kojiRiceKg, totalRiceKg)) : null,
    waterL,
    waterRatioPct: totalRiceKg > 0 ? roundPct(waterRatioPct(waterL, totalRiceKg)) : null,
    addedAlcoholKg: alcohol.kg,
    addedAlcohol95Kg: alcohol.kg95,
    additions,
  };
}
export type TankSummary = ReturnType<typeof tankSummary>;

/**
 * The tank lot a tank's name stands for, as `actor` may see it: the newest lot of that name still
 * holding mash, else the newest of that name (just pressed). Names compare without case.
 */
export function findTankLotByName(actor: SessionUser, name: string) {
  const key = name.trim().replace(/\s+/g, " ").toLowerCase();
  if (!key || key.length > 40) return null;
  const row = getDb()
    .select({ code: lots.code })
    .from(lots)
    .where(and(eq(lots.kind, "tank"), sql`lower(json_extract(${lots.attributes}, '$.tankName')) = ${key}`, visibleTo(actor)))
    .orderBy(sql`${lots.onHand} > 0 desc`, desc(lots.id))
    .get();
  return row ? findLot(actor, row.code) : null;
}
