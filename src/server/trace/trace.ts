import "server-only";
import { sql } from "drizzle-orm";
import { getDb } from "../platform/db";
import { notFound } from "../platform/errors";
import { findLotId } from "../ledger/lots";
import { KeptByLot } from "./kept-by-lot";
import type { SessionUser } from "../accounts/session";

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
  if (id === null) throw notFound({ key: "errors.lotNotFound", values: { code } });
  return getDb().get<LotHead>(sql`select id, code, kind, content_in as contentIn from lots where id = ${id}`)!;
}

/**
 * Every harvest lot behind a lot, with the share of the lot's rice (or, for sake, volume)
 * it accounts for: one indexed read of the composition kept as events were recorded.
 */
export function sourcesOf(lotId: number, contentIn: number): TraceSource[] {
  if (contentIn <= 0) return [];
  const amounts = getDb()
    .all<{ source: number; amount: number }>(sql`select source_lot_id as source, sum(amount) as amount from lot_source_deltas where lot_id = ${lotId} group by source_lot_id`)
    .filter((a) => Math.abs(a.amount) > 1e-9);
  const lots = harvestLots.fixedOf(
    amounts.map((a) => a.source),
    readHarvestLots,
  );
  // Growers' and fields' names are the office's to change: read every time (a few dozen rows each).
  const growers = new Map(getDb().all<{ id: string; name: string }>(sql`select id, name from parties`).map((p) => [p.id, p.name]));
  const fields = new Map(getDb().all<{ id: string; name: string; region: string }>(sql`select id, name, region from fields`).map((f) => [f.id, f]));
  const rows = amounts.map((a) => ({ amount: a.amount, lot: lots.get(a.source)! }));
  // Largest share first, then by code (as SQLite's binary collation orders them).
  rows.sort((x, y) => y.amount - x.amount || (x.lot.code < y.lot.code ? -1 : x.lot.code > y.lot.code ? 1 : 0));
  return rows.map(({ amount, lot }) => {
    const field = lot.fieldId ? fields.get(lot.fieldId) : undefined;
    return {
      code: lot.code,
      share: amount / contentIn,
      variety: lot.variety,
      cropYear: lot.cropYear,
      grade: lot.grade,
      grower: { id: lot.growerId, name: growers.get(lot.growerId)! },
      field: field ? { id: field.id, name: field.name, region: field.region } : null,
    };
  });
}

/** What a harvest lot is, fixed when it is registered: its code, variety, crop year, grade, grower and field. */
type HarvestLot = { code: string; variety: string | null; cropYear: number | null; grade: string | null; growerId: string; fieldId: string | null };
const harvestLots = new KeptByLot<HarvestLot>("harvest lots", 200_000);

function readHarvestLots(ids: number[]): Map<number, HarvestLot> {
  const rows = getDb().all<{ id: number } & HarvestLot>(sql`
    select id, code, variety, crop_year as cropYear, grade, origin_party_id as growerId, field_id as fieldId
    from lots where id in (select value from json_each(${JSON.stringify(ids)}))`);
  return new Map(rows.map(({ id, ...lot }) => [id, lot]));
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
  // The distinct descendants and the net edges among them, in one statement; the fractions
  // are then multiplied once per edge in topological order, not once per path (a lot reached
  // through many blends would otherwise be walked once for every route to it).
  const edges = db.all<{ parent: number; child: number; weight: number; contentIn: number }>(sql`
    with recursive down(lot_id) as (
      select ${lot.id}
      union
      select e.child_lot_id from down join lineage_edges e on e.parent_lot_id = down.lot_id
    )
    select e.parent_lot_id as parent, e.child_lot_id as child, sum(e.weight) as weight, c.content_in as contentIn
    from lineage_edges e join down on down.lot_id = e.parent_lot_id join lots c on c.id = e.child_lot_id
    group by e.parent_lot_id, e.child_lot_id`);
  const fractions = fractionsDown(lot.id, edges);
  const ids = [...fractions].filter(([id, f]) => id !== lot.id && Math.abs(f) > 1e-9).map(([id]) => id);
  if (!ids.length) return [];
  const heads = new Map(db.all<{ id: number; code: string; kind: string }>(sql`select id, code, kind from lots where id in (${sql.join(ids.map((id) => sql`${id}`), sql`, `)})`).map((r) => [r.id, r]));
  return ids.sort((a, b) => a - b).map((id) => ({ code: heads.get(id)!.code, kind: heads.get(id)!.kind, fraction: fractions.get(id)! }));
}

/** Kahn's order over the descendants' edges: each lot's fraction is final before it is passed on. */
export function fractionsDown(start: number, edges: { parent: number; child: number; weight: number; contentIn: number }[]): Map<number, number> {
  const out = new Map<number, typeof edges>();
  const indegree = new Map<number, number>();
  for (const e of edges) {
    (out.get(e.parent) ?? out.set(e.parent, []).get(e.parent)!).push(e);
    indegree.set(e.child, (indegree.get(e.child) ?? 0) + 1);
  }
  const fraction = new Map<number, number>([[start, 1]]);
  const ready = [start];
  while (ready.length) {
    const id = ready.pop()!;
    for (const e of out.get(id) ?? []) {
      if (e.contentIn > 0 && Math.abs(e.weight) > 1e-12) fraction.set(e.child, (fraction.get(e.child) ?? 0) + ((fraction.get(id) ?? 0) * e.weight) / e.contentIn);
      const left = indegree.get(e.child)! - 1;
      indegree.set(e.child, left);
      if (left === 0) ready.push(e.child);
    }
  }
  return fraction;
}

export function traceForward(actor: SessionUser, code: string) {
  const lot = head(actor, code);
  return { lot: { code: lot.code, kind: lot.kind }, reached: descendantsOf(lot) };
}

export { head as traceHead };
