import "server-only";
import { sql } from "drizzle-orm";
import { getDb } from "../platform/db";

/** A lot behind another; code, attributes and polishing ratio are read for tanks and polished lots only. */
export type AncestorLot = { id: number; code: string; kind: string; contentIn: number; attributes: string | null; polishingRatioPct: number | null };

type Lineage = {
  lots: Map<number, { kind: string; contentIn: number }>;
  parentsOf: Map<number, { parent: number; weight: number }[]>;
  /** Tanks and polished lots, whose codes and figures are read with every answer. */
  described: number[];
  /** Walks already made over this lineage, by start and stop kinds. */
  walks: Map<string, Map<number, number>>;
};

/** The distinct lots behind a lot and the edges among them, with the tanks' and polished lots' current details. */
export type Ancestry = Lineage & { details: Map<number, { code: string; attributes: string | null; polishingRatioPct: number | null }> };

/**
 * Everything behind a lot up to its harvest lots, read in one statement: each lot once, however
 * many routes lead to it (a blend of blends reaches its rice by tens of thousands of paths).
 * Lots with no content pass nothing on, so the walk stops there as the fraction walks do.
 */
function readLineage(lotId: number): Lineage {
  // Handed over as a few flat JSON arrays built inside SQLite: thousands of rows cost more to
  // pass to JavaScript one by one than the walk itself.
  const row = getDb().get<Record<"ids" | "kinds" | "contents" | "children" | "parents" | "weights", string>>(sql`
    with recursive up(lot_id) as (
      select ${lotId}
      union
      select e.parent_lot_id from up join lots c on c.id = up.lot_id join lineage_edges e on e.child_lot_id = up.lot_id
      where c.kind <> 'harvest' and c.content_in > 0
    )
    select * from
      (select json_group_array(c.id) as ids, json_group_array(c.kind) as kinds, json_group_array(c.content_in) as contents
       from up join lots c on c.id = up.lot_id),
      (select json_group_array(e.child_lot_id) as children, json_group_array(e.parent_lot_id) as parents, json_group_array(e.weight) as weights
       from up join lots c on c.id = up.lot_id join lineage_edges e on e.child_lot_id = c.id
       where c.kind <> 'harvest' and c.content_in > 0)`)!;
  const [ids, kinds, contents] = [JSON.parse(row.ids) as number[], JSON.parse(row.kinds) as string[], JSON.parse(row.contents) as number[]];
  const lots = new Map(ids.map((id, n) => [id, { kind: kinds[n]!, contentIn: contents[n]! }]));
  // Every edge as recorded: a link and its reversal both pass, and cancel in the sums.
  const [children, parents, weights] = [JSON.parse(row.children) as number[], JSON.parse(row.parents) as number[], JSON.parse(row.weights) as number[]];
  const parentsOf = new Map<number, { parent: number; weight: number }[]>();
  children.forEach((child, n) => (parentsOf.get(child) ?? parentsOf.set(child, []).get(child)!).push({ parent: parents[n]!, weight: weights[n]! }));
  const described = ids.filter((_, n) => kinds[n] === "tank" || kinds[n] === "polished");
  return { lots, parentsOf, described, walks: new Map() };
}

/**
 * Edges and contents change only when an event is recorded (a correction is an event too), so a
 * lineage read stays true until the newest event or edge changes. A bottle's page is opened by
 * everyone who scans its batch; the few latest lineages are kept for them.
 */
const recent = new Map<number, { version: string; lineage: Lineage }>();
const KEEP = 16;

function ledgerVersion(): string {
  const row = getDb().get<{ e: number | null; l: number | null }>(sql`select (select max(id) from events) as e, (select max(id) from lineage_edges) as l`);
  return `${row?.e}/${row?.l}`;
}

export function ancestryOf(lotId: number): Ancestry {
  const version = ledgerVersion();
  const kept = recent.get(lotId);
  const lineage = kept?.version === version ? kept.lineage : readLineage(lotId);
  recent.delete(lotId);
  recent.set(lotId, { version, lineage });
  if (recent.size > KEEP) recent.delete(recent.keys().next().value!);
  // Codes, tank attributes and ratios are read fresh every time: they are not tied to events.
  const details = new Map(
    getDb()
      .all<{ id: number; code: string; attributes: string | null; polishingRatioPct: number | null }>(sql`
        select id, code, case when kind = 'tank' then attributes end as attributes, polishing_ratio_pct as polishingRatioPct
        from lots where id in (select value from json_each(${JSON.stringify(lineage.described)}))`)
      .map(({ id, ...d }) => [id, d]),
  );
  return { ...lineage, details };
}

/**
 * The fraction of `start`'s content each lot behind it gave, walking up until lots of the
 * `stop` kinds (and harvest lots). Summed over every path, as the path-by-path walk sums, but
 * each net edge is multiplied once, in topological order; reversed edges cancel in the sums.
 */
export function fractionsUp(ancestry: Ancestry, start: number, stop: readonly string[]): Map<number, number> {
  const key = `${start}:${stop.join(",")}`;
  const made = ancestry.walks.get(key);
  if (made) return made;
  const fractions = walkUp(ancestry, start, stop);
  ancestry.walks.set(key, fractions);
  return fractions;
}

function walkUp(ancestry: Ancestry, start: number, stop: readonly string[]): Map<number, number> {
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

/** Lots of one kind behind `start` with the fraction they gave, as the path-by-path walk answers. */
export function lotsOfKindUp(ancestry: Ancestry, start: number, kind: "tank" | "polished"): (AncestorLot & { fraction: number })[] {
  return [...fractionsUp(ancestry, start, [kind])]
    .filter(([id, f]) => ancestry.lots.get(id)?.kind === kind && Math.abs(f) > 1e-9)
    .map(([id, fraction]) => ({ id, ...ancestry.lots.get(id)!, ...ancestry.details.get(id)!, fraction }))
    .sort((a, b) => a.id - b.id);
}
