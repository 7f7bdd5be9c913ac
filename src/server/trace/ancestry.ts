import "server-only";
import { sql } from "drizzle-orm";
import { getDb } from "../platform/db";

/** A lot behind another; code, attributes and polishing ratio are read for tanks and polished lots only. */
export type AncestorLot = { id: number; code: string; kind: string; contentIn: number; attributes: string | null; polishingRatioPct: number | null };

/** The distinct lots behind a lot and the edges among them. */
export type Ancestry = { lots: Map<number, AncestorLot>; parentsOf: Map<number, { parent: number; weight: number }[]> };

/**
 * Everything behind a lot up to its harvest lots, read in one statement: each lot once, however
 * many routes lead to it (a blend of blends reaches its rice by tens of thousands of paths).
 * Lots with no content pass nothing on, so the walk stops there as the fraction walks do.
 */
export function ancestryOf(lotId: number): Ancestry {
  // Handed over as a few flat JSON arrays built inside SQLite: thousands of rows cost more to
  // pass to JavaScript one by one than the walk itself. Codes and figures only where read.
  const row = getDb().get<Record<"ids" | "kinds" | "contents" | "details" | "children" | "parents" | "weights", string>>(sql`
    with recursive up(lot_id) as (
      select ${lotId}
      union
      select e.parent_lot_id from up join lots c on c.id = up.lot_id join lineage_edges e on e.child_lot_id = up.lot_id
      where c.kind <> 'harvest' and c.content_in > 0
    )
    select * from
      (select json_group_array(c.id) as ids, json_group_array(c.kind) as kinds, json_group_array(c.content_in) as contents,
         json_group_array(json_array(c.id, c.code, case when c.kind = 'tank' then c.attributes end, c.polishing_ratio_pct)) filter (where c.kind in ('tank', 'polished')) as details
       from up join lots c on c.id = up.lot_id),
      (select json_group_array(e.child_lot_id) as children, json_group_array(e.parent_lot_id) as parents, json_group_array(e.weight) as weights
       from up join lots c on c.id = up.lot_id join lineage_edges e on e.child_lot_id = c.id
       where c.kind <> 'harvest' and c.content_in > 0)`)!;
  const [ids, kinds, contents] = [JSON.parse(row.ids) as number[], JSON.parse(row.kinds) as string[], JSON.parse(row.contents) as number[]];
  const lots = new Map<number, AncestorLot>();
  ids.forEach((id, n) => lots.set(id, { id, code: "", kind: kinds[n]!, contentIn: contents[n]!, attributes: null, polishingRatioPct: null }));
  for (const [id, code, attributes, polishingRatioPct] of JSON.parse(row.details) as [number, string, string | null, number | null][]) {
    Object.assign(lots.get(id)!, { code, attributes, polishingRatioPct });
  }
  // Every edge as recorded: a link and its reversal both pass, and cancel in the sums.
  const [children, parents, weights] = [JSON.parse(row.children) as number[], JSON.parse(row.parents) as number[], JSON.parse(row.weights) as number[]];
  const parentsOf = new Map<number, { parent: number; weight: number }[]>();
  children.forEach((child, n) => (parentsOf.get(child) ?? parentsOf.set(child, []).get(child)!).push({ parent: parents[n]!, weight: weights[n]! }));
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
  // Edges counted only from lots the walk passes through, so that Kahn's order is not held back by lots it never reaches.
  const waiting = new Map<number, number>();
  const seen = new Set([start]);
  const todo = [start];
  while (todo.length) {
    const id = todo.pop()!;
    if (!passesOn(id)) continue;
    for (const e of ancestry.parentsOf.get(id) ?? []) {
      waiting.set(e.parent, (waiting.get(e.parent) ?? 0) + 1);
      if (!seen.has(e.parent)) seen.add(e.parent) && todo.push(e.parent);
    }
  }
  const fraction = new Map([[start, 1]]);
  const ready = [start];
  while (ready.length) {
    const id = ready.pop()!;
    if (!passesOn(id)) continue;
    const [share, contentIn] = [fraction.get(id) ?? 0, ancestry.lots.get(id)!.contentIn];
    for (const e of ancestry.parentsOf.get(id) ?? []) {
      fraction.set(e.parent, (fraction.get(e.parent) ?? 0) + (share * e.weight) / contentIn);
      const left = waiting.get(e.parent)! - 1;
      waiting.set(e.parent, left);
      if (left === 0) ready.push(e.parent);
    }
  }
  return fraction;
}

/** Lots of one kind behind `start` with the fraction they gave, as `ancestorsOfKind` answers. */
export function lotsOfKindUp(ancestry: Ancestry, start: number, kind: "tank" | "polished"): (AncestorLot & { fraction: number })[] {
  return [...fractionsUp(ancestry, start, [kind])]
    .filter(([id, f]) => ancestry.lots.get(id)?.kind === kind && Math.abs(f) > 1e-9)
    .map(([id, fraction]) => ({ ...ancestry.lots.get(id)!, fraction }))
    .sort((a, b) => a.id - b.id);
}
