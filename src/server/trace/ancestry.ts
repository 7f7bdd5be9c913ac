import "server-only";
import { sql } from "drizzle-orm";
import { getDb } from "../platform/db";

/** A lot behind another; code, attributes and polishing ratio are read for tanks and polished lots only. */
export type AncestorLot = { id: number; code: string; kind: string; contentIn: number; attributes: string | null; polishingRatioPct: number | null };

type Lineage = {
  lots: Map<number, { kind: string; contentIn: number }>;
  /** Lots by position (ids, kinds, contents) and each lot's recorded edges as a slice of `parent`/`weight` (from `first[n]` to `first[n + 1]`). */
  at: Map<number, number>;
  ids: number[];
  kinds: string[];
  contents: number[];
  first: Int32Array;
  parent: Int32Array;
  weight: Float64Array;
  /** Tanks and polished lots, whose codes and figures are read with every answer. */
  described: number[];
  /** Walks already made over this lineage, by start and stop kinds. */
  walks: Map<string, Map<number, number>>;
  /** Per-lot counters of a walk, made once per lineage and cleared after each walk (a blend's 144 tanks are 288 walks). */
  scratch: { waiting: Int32Array; seen: Uint8Array; share: Float64Array; given: Uint8Array };
};

/** The distinct lots behind a lot and the edges among them, with the tanks' and polished lots' current details. */
export type Ancestry = Lineage & { details: Map<number, { code: string; attributes: string | null; polishingRatioPct: number | null }> };

/**
 * Everything behind a lot up to its harvest lots: each lot once, however many routes lead to it
 * (a blend of blends reaches its rice by tens of thousands of paths). Lots with no content pass
 * nothing on, so the walk stops there as the fraction walks do.
 */
function readLineage(lotId: number): Lineage {
  const head = getDb().get<{ kind: string; contentIn: number }>(sql`select kind, content_in as contentIn from lots where id = ${lotId}`);
  const ids: number[] = [];
  const kinds: string[] = [];
  const contents: number[] = [];
  const at = new Map<number, number>();
  const found = (id: number, kind: string, contentIn: number) => (at.set(id, ids.length), ids.push(id), kinds.push(kind), contents.push(contentIn));
  if (head) found(lotId, head.kind, head.contentIn);
  // Every edge as recorded: a link and its reversal both pass, and cancel in the sums.
  const [children, parents, weights]: [number[], number[], number[]] = [[], [], []];
  // One step up at a time, each lot's edges read once: one recursive statement read every edge
  // twice (to find the lots, then to hand the edges over) and kept a sorted copy of the lots.
  for (let step = ids.slice(); step.length; ) {
    const open = step.filter((id) => kinds[at.get(id)!] !== "harvest" && contents[at.get(id)!]! > 0);
    step = [];
    if (!open.length) break;
    const edges = parentsStep(open);
    edges.children.forEach((child, n) => {
      const parent = edges.parents[n]!;
      children.push(child), parents.push(parent), weights.push(edges.weights[n]!);
      if (!at.has(parent)) found(parent, edges.kinds[n]!, edges.contents[n]!), step.push(parent);
    });
  }
  return indexed(ids, kinds, contents, { children, parents, weights });
}

/**
 * The recorded edges into these lots, each with its parent's kind and content. Handed over as
 * flat JSON arrays built inside SQLite: thousands of rows cost more to pass to JavaScript one
 * by one than the walk itself.
 */
function parentsStep(lotIds: number[]) {
  const row = getDb().get<Record<"children" | "parents" | "weights" | "kinds" | "contents", string>>(sql`
    select json_group_array(e.child_lot_id) as children, json_group_array(e.parent_lot_id) as parents, json_group_array(e.weight) as weights,
      json_group_array(p.kind) as kinds, json_group_array(p.content_in) as contents
    from json_each(${JSON.stringify(lotIds)}) c join lineage_edges e on e.child_lot_id = c.value join lots p on p.id = e.parent_lot_id`)!;
  return {
    children: JSON.parse(row.children) as number[],
    parents: JSON.parse(row.parents) as number[],
    weights: JSON.parse(row.weights) as number[],
    kinds: JSON.parse(row.kinds) as string[],
    contents: JSON.parse(row.contents) as number[],
  };
}

/** Each lot's edges as a slice of two typed arrays, in the order read, so that the sums add up in the same order every time. */
function indexed(ids: number[], kinds: string[], contents: number[], edges: { children: number[]; parents: number[]; weights: number[] }): Lineage {
  const at = new Map(ids.map((id, n) => [id, n]));
  const lots = new Map(ids.map((id, n) => [id, { kind: kinds[n]!, contentIn: contents[n]! }]));
  const first = new Int32Array(ids.length + 1);
  for (const child of edges.children) first[at.get(child)! + 1]!++;
  for (let n = 0; n < ids.length; n++) first[n + 1]! += first[n]!;
  const next = first.slice(0, ids.length);
  const [parent, weight] = [new Int32Array(edges.children.length), new Float64Array(edges.children.length)];
  edges.children.forEach((child, n) => {
    const slot = next[at.get(child)!]!++;
    parent[slot] = at.get(edges.parents[n]!)!;
    weight[slot] = edges.weights[n]!;
  });
  const described = ids.filter((_, n) => kinds[n] === "tank" || kinds[n] === "polished");
  const scratch = { waiting: new Int32Array(ids.length), seen: new Uint8Array(ids.length), share: new Float64Array(ids.length), given: new Uint8Array(ids.length) };
  return { lots, at, ids, kinds, contents, first, parent, weight, described, walks: new Map(), scratch };
}

/**
 * Edges and contents change only when an event is recorded (a correction is an event too): a
 * lot's content grows with the events it comes out of and shrinks when one is corrected (the
 * correction draws it), and new lots join a lineage only by a new edge into it. So a lineage
 * read stays true until an event touches one of its lots, and past that while no edge comes into
 * one and no content moves (`unchanged`). A bottle's page is opened by
 * everyone who scans its batch, while the floor records events all day on other lots; the few
 * latest lineages are kept for them.
 */
const recent = new Map<number, { seen: LedgerMark; lineage: Lineage }>();
const KEEP = 16;
/** More rows touched than this since a lineage was read, and it is read again rather than checked. */
const CHECK_AT_MOST = 20_000;

export type LedgerMark = { event: number; edge: number };

function ledgerMark(): LedgerMark {
  const row = getDb().get<{ e: number | null; l: number | null }>(sql`select (select max(id) from events) as e, (select max(id) from lineage_edges) as l`);
  return { event: row?.e ?? 0, edge: row?.l ?? 0 };
}

/**
 * The lots touched since `seen`: out of, drawn from, or linked into by what was recorded after it.
 * UNION ALL, so that each part reads only the rows after the mark by its own index: a UNION's
 * de-duplication made SQLite scan all three tables in lot order instead (87 ms against 0.1).
 */
export const touchedSince = (seen: LedgerMark) => sql`
  select json_group_array(lot_id) as lots, count(*) as n from (
    select lot_id from event_outputs where event_id > ${seen.event}
    union all select lot_id from event_inputs where event_id > ${seen.event}
    union all select child_lot_id from lineage_edges where id > ${seen.edge})`;

/**
 * Whether the lineage read at `seen` is still what a read now would give. Only the kinds and
 * contents of its lots and the edges into them make it, so an event that touched none of its
 * lots keeps it; and so does one that touched some without changing what the lineage holds: no
 * edge recorded into one of them, and each one's content as read (a shipment or a sample draws
 * from a bottling without changing what went into it).
 */
function unchanged(lineage: Lineage, seen: LedgerMark, now: LedgerMark): boolean {
  if (seen.event === now.event && seen.edge === now.edge) return true;
  const row = getDb().get<{ lots: string; n: number }>(touchedSince(seen))!;
  if (row.n > CHECK_AT_MOST) return false;
  const hit = [...new Set(JSON.parse(row.lots) as number[])].filter((id) => lineage.at.has(id));
  if (!hit.length) return true;
  const current = getDb().get<{ edges: number; contents: string }>(sql`
    select (select count(*) from lineage_edges where id > ${seen.edge} and child_lot_id in (select value from json_each(${JSON.stringify(hit)}))) as edges,
      (select json_group_array(json_array(id, content_in)) from lots where id in (select value from json_each(${JSON.stringify(hit)}))) as contents`)!;
  if (current.edges > 0) return false;
  return (JSON.parse(current.contents) as [number, number][]).every(([id, contentIn]) => lineage.contents[lineage.at.get(id)!] === contentIn);
}

export function ancestryOf(lotId: number): Ancestry {
  const now = ledgerMark();
  const kept = recent.get(lotId);
  const lineage = kept && unchanged(kept.lineage, kept.seen, now) ? kept.lineage : readLineage(lotId);
  recent.delete(lotId);
  recent.set(lotId, { seen: now, lineage });
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
  const { at, ids, kinds, contents, first, parent, weight } = ancestry;
  const passesOn = (n: number) => kinds[n] !== "harvest" && !stop.includes(kinds[n]!) && contents[n]! > 0;
  const from = at.get(start);
  if (from === undefined) return new Map([[start, 1]]);
  const { waiting, seen, share, given } = ancestry.scratch;
  // Edges counted only from lots the walk passes through, so that Kahn's order is not held back by lots it never reaches.
  seen[from] = 1;
  const todo = [from];
  const touched = [from];
  while (todo.length) {
    const n = todo.pop()!;
    if (!passesOn(n)) continue;
    for (let e = first[n]!; e < first[n + 1]!; e++) {
      const p = parent[e]!;
      waiting[p]!++;
      if (!seen[p]) (seen[p] = 1), todo.push(p), touched.push(p);
    }
  }
  // Fractions by position; `reached` keeps the order each lot was first given one, as the Map of before did.
  const reached = [from];
  share[from] = 1;
  given[from] = 1;
  const ready = [from];
  while (ready.length) {
    const n = ready.pop()!;
    if (!passesOn(n)) continue;
    const [own, contentIn] = [share[n]!, contents[n]!];
    for (let e = first[n]!; e < first[n + 1]!; e++) {
      const p = parent[e]!;
      share[p] = share[p]! + (own * weight[e]!) / contentIn;
      if (!given[p]) (given[p] = 1), reached.push(p);
      if (--waiting[p]! === 0) ready.push(p);
    }
  }
  const fractions = new Map(reached.map((n) => [ids[n]!, share[n]!]));
  for (const n of touched) (waiting[n] = 0), (seen[n] = 0), (share[n] = 0), (given[n] = 0);
  return fractions;
}

/** Lots of one kind behind `start` with the fraction they gave, as the path-by-path walk answers. */
export function lotsOfKindUp(ancestry: Ancestry, start: number, kind: "tank" | "polished"): (AncestorLot & { fraction: number })[] {
  return [...fractionsUp(ancestry, start, [kind])]
    .filter(([id, f]) => ancestry.lots.get(id)?.kind === kind && Math.abs(f) > 1e-9)
    .map(([id, fraction]) => ({ id, ...ancestry.lots.get(id)!, ...ancestry.details.get(id)!, fraction }))
    .sort((a, b) => a.id - b.id);
}

/**
 * `start` and the lots behind it, going up only through lots of the `through` kinds (every
 * recorded edge, reversed ones too), as a recursive read of the edges would give. Null when
 * the way passes a lot whose edges the lineage did not read (one with no content).
 */
export function lotsUpThrough(ancestry: Ancestry, start: number, through: readonly string[]): number[] | null {
  const { at, ids, kinds, contents, first, parent } = ancestry;
  const from = at.get(start);
  if (from === undefined) return null;
  const seen = new Uint8Array(ids.length);
  seen[from] = 1;
  const todo = [from];
  const reached = [start];
  while (todo.length) {
    const n = todo.pop()!;
    if (!through.includes(kinds[n]!)) continue;
    if (!(contents[n]! > 0)) return null;
    for (let e = first[n]!; e < first[n + 1]!; e++) {
      const p = parent[e]!;
      if (!seen[p]) (seen[p] = 1), todo.push(p), reached.push(ids[p]!);
    }
  }
  return reached;
}
