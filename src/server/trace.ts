import "server-only";
import { sql } from "drizzle-orm";
import { getDb } from "./db";
import { notFound } from "./errors";
import { findLotId } from "./lots";
import type { SessionUser } from "./session";

export type TraceSource = {
  code: string;
  share: number;
  variety: string | null;
  cropYear: number | null;
  grade: string | null;
  grower: { id: string; name: string };
  field: { id: string; name: string; region: string } | null;
};

type LotHead = { id: number; code: string; kind: string; contentIn: number };

function head(actor: SessionUser, code: string): LotHead {
  const id = findLotId(actor, code);
  if (id === null) throw notFound(`Lot ${code}`);
  return getDb().get<LotHead>(sql`select id, code, kind, content_in as contentIn from lots where id = ${id}`)!;
}

/**
 * Every harvest lot behind a lot, with the share of the lot's rice (or, for sake, volume)
 * it accounts for: one indexed read of the composition kept as events were recorded.
 */
export function sourcesOf(lotId: number, contentIn: number): TraceSource[] {
  if (contentIn <= 0) return [];
  const rows = getDb().all<{ code: string; amount: number; variety: string | null; cropYear: number | null; grade: string | null; growerId: string; growerName: string; fieldId: string | null; fieldName: string | null; region: string | null }>(sql`
    select s.code, d.amount, s.variety, s.crop_year as cropYear, s.grade, g.id as growerId, g.name as growerName, f.id as fieldId, f.name as fieldName, f.region
    from (select source_lot_id, sum(amount) as amount from lot_source_deltas where lot_id = ${lotId} group by source_lot_id) d
    join lots s on s.id = d.source_lot_id
    join parties g on g.id = s.origin_party_id
    left join fields f on f.id = s.field_id
    where abs(d.amount) > 1e-9
    order by d.amount desc, s.code`);
  return rows.map((r) => ({
    code: r.code,
    share: r.amount / contentIn,
    variety: r.variety,
    cropYear: r.cropYear,
    grade: r.grade,
    grower: { id: r.growerId, name: r.growerName },
    field: r.fieldId ? { id: r.fieldId, name: r.fieldName!, region: r.region! } : null,
  }));
}

export function traceBackward(actor: SessionUser, code: string) {
  const lot = head(actor, code);
  return { lot: { code: lot.code, kind: lot.kind }, sources: sourcesOf(lot.id, lot.contentIn) };
}

export type Reached = { code: string; kind: string; fraction: number };

/**
 * Every lot a lot reached, with the fraction of it that came from this lot. From a harvest
 * lot this is the composition index read the other way; from any other lot, a recursive
 * walk down the lineage edges inside SQLite.
 */
export function descendantsOf(lot: LotHead): Reached[] {
  const db = getDb();
  if (lot.kind === "harvest") {
    return db.all<Reached>(sql`
      select l.code, l.kind, d.amount / l.content_in as fraction
      from (select lot_id, sum(amount) as amount from lot_source_deltas where source_lot_id = ${lot.id} group by lot_id) d
      join lots l on l.id = d.lot_id
      where l.id <> ${lot.id} and l.content_in > 0 and abs(d.amount) > 1e-9
      order by l.id`);
  }
  return db.all<Reached>(sql`
    with recursive down(lot_id, frac) as (
      select ${lot.id}, 1.0
      union all
      select e.child_lot_id, down.frac * e.weight / c.content_in
      from down
      join lineage_edges e on e.parent_lot_id = down.lot_id
      join lots c on c.id = e.child_lot_id
      where c.content_in > 0
    )
    select l.code, l.kind, sum(down.frac) as fraction
    from down join lots l on l.id = down.lot_id
    where down.lot_id <> ${lot.id}
    group by down.lot_id
    having abs(sum(down.frac)) > 1e-9
    order by down.lot_id`);
}

export function traceForward(actor: SessionUser, code: string) {
  const lot = head(actor, code);
  return { lot: { code: lot.code, kind: lot.kind }, reached: descendantsOf(lot) };
}

export { head as traceHead };
