import "server-only";
import { sql } from "drizzle-orm";
import { getDb } from "../platform/db";
import { fractionsDown } from "./trace";

export type AncestorLot = { id: number; code: string; kind: string; contentIn: number; attributes: string | null; polishingRatioPct: number | null };

/** The distinct lots behind a lot and the net edge (summed weights) between each pair of them. */
export type Ancestry = { lots: Map<number, AncestorLot>; parentsOf: Map<number, { parent: number; weight: number }[]> };

/**
 * Everything behind a lot up to its harvest lots, read in one statement: each lot once, however
 * many routes lead to it (a blend of blends reaches its rice by tens of thousands of paths).
 * Lots with no content pass nothing on, so the walk stops there as the fraction walks do.
 */
export function ancestryOf(lotId: number): Ancestry {
  // Built as two JSON texts inside SQLite: thousands of rows cost more to hand to JavaScript one by one than to walk.
  const row = getDb().get<{ nodes: string; edges: string }>(sql`
    with recursive up(lot_id) as (
      select ${lotId}
      union
      select e.parent_lot_id from up join lots c on c.id = up.lot_id join lineage_edges e on e.child_lot_id = up.lot_id
      where c.kind <> 'harvest' and c.content_in > 0
    )
    select
      (select json_group_array(json_array(c.id, c.code, c.kind, c.content_in, case when c.kind = 'tank' then c.attributes end, c.polishing_ratio_pct))
        from up join lots c on c.id = up.lot_id) as nodes,
      (select json_group_array(json_array(e.child_lot_id, e.parent_lot_id, e.weight))
        from up join lots c on c.id = up.lot_id join lineage_edges e on e.child_lot_id = c.id
        where c.kind <> 'harvest' and c.content_in > 0) as edges`)!;
  const lots = new Map<number, AncestorLot>();
  for (const [id, code, kind, contentIn, attributes, polishingRatioPct] of JSON.parse(row.nodes) as [number, string, string, number, string | null, number | null][]) {
    lots.set(id, { id, code, kind, contentIn, attributes, polishingRatioPct });
  }
  const net = new Map<number, Map<number, number>>();
  for (const [child, parent, weight] of JSON.parse(row.edges) as [number, number, number][]) {
    const sums = net.get(child) ?? net.set(child, new Map()).get(child)!;
    sums.set(parent, (sums.get(parent) ?? 0) + weight);
  }
  const parentsOf = new Map([...net].map(([child, sums]) => [child, [...sums].map(([parent, weight]) => ({ parent, weight }))]));
  return { lots, parentsOf };
}

/**
 * The fraction of `start`'s content each lot behind it gave, walking up until lots of the
 * `stop` kinds (and harvest lots). Summed over every path, as the path-by-path walk sums, but
 * each net edge is multiplied once, in topological order; reversed edges cancel in the sums.
 */
export function fractionsUp(ancestry: Ancestry, start: number, stop: readonly string[]): Map<number, number> {
  const passesOn = (id: number) => {
    const lot = ancestry.lots.get(id);
    return lot !== undefined && lot.kind !== "harvest" && !stop.includes(lot.kind) && lot.contentIn > 0;
  };
  // Only the edges the walk can take, so that Kahn's order is not held back by lots it never reaches.
  const edges: { parent: number; child: number; weight: number; contentIn: number }[] = [];
  const seen = new Set([start]);
  const todo = [start];
  while (todo.length) {
    const id = todo.pop()!;
    if (!passesOn(id)) continue;
    for (const e of ancestry.parentsOf.get(id) ?? []) {
      edges.push({ parent: id, child: e.parent, weight: e.weight, contentIn: ancestry.lots.get(id)!.contentIn });
      if (!seen.has(e.parent)) seen.add(e.parent) && todo.push(e.parent);
    }
  }
  return fractionsDown(start, edges);
}

/** Lots of one kind behind `start` with the fraction they gave, as `ancestorsOfKind` answers. */
export function lotsOfKindUp(ancestry: Ancestry, start: number, kind: "tank" | "polished"): (AncestorLot & { fraction: number })[] {
  return [...fractionsUp(ancestry, start, [kind])]
    .filter(([id, f]) => ancestry.lots.get(id)?.kind === kind && Math.abs(f) > 1e-9)
    .map(([id, fraction]) => ({ ...ancestry.lots.get(id)!, fraction }))
    .sort((a, b) => a.id - b.id);
}
