import "server-only";
import { sql } from "drizzle-orm";
import { getDb, getSqlite } from "../platform/db";

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

/** Lots by position as a lineage is read, and the edges read, in the order read. */
type Found = { ids: number[]; kinds: string[]; contents: number[]; at: Map<number, number> };
type Edges = { children: number[]; parents: number[]; weights: number[] };

/** Lots with no content, and harvest lots, pass nothing on: their edges are not read. */
const passesOn = (kind: string, contentIn: number) => kind !== "harvest" && contentIn > 0;

/**
 * Everything behind a lot up to its harvest lots: each lot once, however many routes lead to it
 * (a blend of blends reaches its rice by tens of thousands of paths). Lots with no content pass
 * nothing on, so the walk stops there as the fraction walks do.
 */
function readLineage(lotId: number): Lineage {
  const head = getDb().get<{ kind: string; contentIn: number }>(sql`select kind, content_in as contentIn from lots where id = ${lotId}`);
  const found: Found = { ids: [], kinds: [], contents: [], at: new Map() };
  if (head) add(found, lotId, head.kind, head.contentIn);
  const edges: Edges = { children: [], parents: [], weights: [] };
  climb(found, found.ids.slice(), edges);
  return indexed(found, edges);
}

function add(found: Found, id: number, kind: string, contentIn: number) {
  found.at.set(id, found.ids.length);
  found.ids.push(id), found.kinds.push(kind), found.contents.push(contentIn);
}

/**
 * Reads the edges into the lots of `step` that pass rice on, then into every lot first found
 * behind them, one step up at a time, each lot's edges once: one recursive statement read every
 * edge twice (to find the lots, then to hand the edges over) and kept a sorted copy of the lots.
 * Every edge as recorded: a link and its reversal both pass, and cancel in the sums.
 */
function climb(found: Found, step: number[], edges: Edges) {
  const { at, kinds, contents } = found;
  while (step.length) {
    const open = step.filter((id) => passesOn(kinds[at.get(id)!]!, contents[at.get(id)!]!));
    step = [];
    if (!open.length) break;
    const read = parentsStep(open);
    read.children.forEach((child, n) => {
      const parent = read.parents[n]!;
      edges.children.push(child), edges.parents.push(parent), edges.weights.push(read.weights[n]!);
      if (!at.has(parent)) add(found, parent, read.kinds[n]!, read.contents[n]!), step.push(parent);
    });
  }
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

/**
 * Each lot's edges as a slice of two typed arrays, in the order read, so that the sums add up in
 * the same order every time. That order is the child index's (lineage_child_idx: parent, then
 * weight, then id), which is how SQLite finds a lot's edges; `broughtUp` keeps it.
 */
function indexed({ ids, kinds, contents, at }: Found, edges: Edges): Lineage {
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
 * correction draws it), and new lots join a lineage only by a new edge into it. Nothing is ever
 * taken away: a reversal is one more edge. So a lineage read stays true until an event touches
 * one of its lots, and past that it is brought up to date from what that event added
 * (`broughtUp`). A bottle's page is opened by everyone who scans its batch, while the floor
 * records events all day on other lots; the few latest lineages are kept for them.
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
 * The lineage read at `seen` as a read now would give it, or null when it must be read anew.
 * Only the kinds and contents of its lots and the edges into them make it. So an event that
 * touched none of its lots keeps it, and so does one that touched some without changing those
 * (a shipment or a sample draws from a bottling without changing what went into it). Otherwise
 * the new edges into its lots are merged into each lot's edges in the order a read gives, the
 * lots first found behind them are read with their own lineage, and contents are taken as they
 * are now; the walks made over lots nothing changed are kept, so that a new edge into a bottling
 * does not walk its 144 tanks again. Read anew: when more was recorded than is worth checking, or
 * a lot of it began or stopped passing rice on (its content went to or from nothing), which
 * changes which lots a read reaches.
 */
function broughtUp(lineage: Lineage, seen: LedgerMark, now: LedgerMark): Lineage | null {
  if (seen.event === now.event && seen.edge === now.edge) return lineage;
  const row = getDb().get<{ lots: string; n: number }>(touchedSince(seen))!;
  if (row.n > CHECK_AT_MOST) return null;
  const hit = [...new Set(JSON.parse(row.lots) as number[])].filter((id) => lineage.at.has(id));
  if (!hit.length) return lineage;
  const [ids, kinds, contents] = [lineage.ids.slice(), lineage.kinds.slice(), lineage.contents.slice()];
  const changed = new Set<number>();
  for (const { id, contentIn } of getDb().all<{ id: number; contentIn: number }>(sql`
    select id, content_in as contentIn from lots where id in (select value from json_each(${JSON.stringify(hit)}))`)) {
    const n = lineage.at.get(id)!;
    if (contents[n] === contentIn) continue;
    if (passesOn(kinds[n]!, contents[n]!) !== passesOn(kinds[n]!, contentIn)) return null;
    contents[n] = contentIn;
    changed.add(id);
  }
  // A read takes no edge into a lot that passes nothing on.
  const added = getDb()
    .all<{ child: number; parent: number; weight: number; kind: string; contentIn: number }>(sql`
      select e.child_lot_id as child, e.parent_lot_id as parent, e.weight, p.kind, p.content_in as contentIn
      from lineage_edges e join lots p on p.id = e.parent_lot_id
      where e.id > ${seen.edge} and e.child_lot_id in (select value from json_each(${JSON.stringify(hit)})) order by e.id`)
    .filter((e) => passesOn(kinds[lineage.at.get(e.child)!]!, contents[lineage.at.get(e.child)!]!));
  if (!changed.size && !added.length) return lineage;
  const found: Found = { ids, kinds, contents, at: new Map(lineage.at) };
  const into = new Map<number, typeof added>();
  const step: number[] = [];
  for (const e of added) {
    changed.add(e.child);
    (into.get(e.child) ?? into.set(e.child, []).get(e.child)!).push(e);
    if (!found.at.has(e.parent)) add(found, e.parent, e.kind, e.contentIn), step.push(e.parent);
  }
  const behind: Edges = { children: [], parents: [], weights: [] };
  climb(found, step, behind);
  const updated = spliced(lineage, found, into, behind);
  // A walk depends only on the lots it reached: kept while none of them changed.
  for (const [key, walk] of lineage.walks) if (![...changed].some((id) => walk.has(id))) updated.walks.set(key, walk);
  return updated;
}

/**
 * `lineage` with the lots first found behind it and the new edges into its own lots. Its lots
 * keep their places (the new ones come after them) and their edges, copied slice by slice; a
 * lot's new edges go where the child index puts them: by parent, then weight, and after the old
 * ones on a tie, as their ids are higher.
 */
function spliced(lineage: Lineage, found: Found, into: Map<number, { parent: number; weight: number }[]>, behind: Edges): Lineage {
  const { ids, kinds, contents, at } = found;
  const old = lineage.ids.length;
  const count = lineage.parent.length + [...into.values()].reduce((a, e) => a + e.length, 0) + behind.children.length;
  const [first, parent, weight] = [new Int32Array(ids.length + 1), new Int32Array(count), new Float64Array(count)];
  let slot = 0;
  for (let n = 0; n < old; n++) {
    first[n] = slot;
    const [from, to] = [lineage.first[n]!, lineage.first[n + 1]!];
    const more = into.get(ids[n]!);
    if (!more) {
      parent.set(lineage.parent.subarray(from, to), slot), weight.set(lineage.weight.subarray(from, to), slot);
      slot += to - from;
      continue;
    }
    const own: { parent: number; weight: number }[] = [];
    for (let e = from; e < to; e++) own.push({ parent: ids[lineage.parent[e]!]!, weight: lineage.weight[e]! });
    own.push(...more);
    own.sort((a, b) => a.parent - b.parent || a.weight - b.weight);
    for (const e of own) (parent[slot] = at.get(e.parent)!), (weight[slot++] = e.weight);
  }
  // The lots first found: their edges as read, bucketed by child in the order read, as `indexed` does.
  const begin = slot;
  for (const child of behind.children) first[at.get(child)! + 1]!++;
  first[old] = begin;
  for (let n = old; n < ids.length; n++) first[n + 1]! += first[n]!;
  const next = first.slice(old, ids.length);
  behind.children.forEach((child, e) => {
    const place = next[at.get(child)! - old]!++;
    parent[place] = at.get(behind.parents[e]!)!;
    weight[place] = behind.weights[e]!;
  });
  const lots = new Map(lineage.lots);
  for (let n = 0; n < ids.length; n++) if (n >= old || contents[n] !== lineage.contents[n]) lots.set(ids[n]!, { kind: kinds[n]!, contentIn: contents[n]! });
  const described = [...lineage.described, ...ids.slice(old).filter((_, n) => kinds[old + n] === "tank" || kinds[old + n] === "polished")];
  const scratch = { waiting: new Int32Array(ids.length), seen: new Uint8Array(ids.length), share: new Float64Array(ids.length), given: new Uint8Array(ids.length) };
  return { lots, at, ids, kinds, contents, first, parent, weight, described, walks: new Map(), scratch };
}

/**
 * Reads made as one: every statement sees the ledger as it stood at the mark, so no edge is
 * taken twice by a lineage brought up to date (once read, once as new) when another process
 * writes meanwhile. Nested in a caller's transaction it is a savepoint.
 */
let snapshot: { sqlite: ReturnType<typeof getSqlite>; read: (lotId: number) => Lineage } | undefined;

function lineageNow(lotId: number): Lineage {
  const sqlite = getSqlite();
  if (snapshot?.sqlite !== sqlite) snapshot = { sqlite, read: sqlite.transaction((id: number) => keptOrRead(id)) };
  return snapshot.read(lotId);
}

function keptOrRead(lotId: number): Lineage {
  const now = ledgerMark();
  const kept = recent.get(lotId);
  const lineage = (kept && broughtUp(kept.lineage, kept.seen, now)) ?? readLineage(lotId);
  recent.delete(lotId);
  recent.set(lotId, { seen: now, lineage });
  if (recent.size > KEEP) recent.delete(recent.keys().next().value!);
  return lineage;
}

/** The lineage as a read now gives it, neither kept nor brought up to date: what the tests hold a kept one to. */
export function ancestryReadAnew(lotId: number): Ancestry {
  return withDetails(readLineage(lotId));
}

export function ancestryOf(lotId: number): Ancestry {
  return withDetails(lineageNow(lotId));
}

/** Codes, tank attributes and ratios are read fresh every time: they are not tied to events. */
function withDetails(lineage: Lineage): Ancestry {
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
  const goesOn = (n: number) => !stop.includes(kinds[n]!) && passesOn(kinds[n]!, contents[n]!);
  const from = at.get(start);
  if (from === undefined) return new Map([[start, 1]]);
  const { waiting, seen, share, given } = ancestry.scratch;
  // Edges counted only from lots the walk passes through, so that Kahn's order is not held back by lots it never reaches.
  seen[from] = 1;
  const todo = [from];
  const touched = [from];
  while (todo.length) {
    const n = todo.pop()!;
    if (!goesOn(n)) continue;
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
    if (!goesOn(n)) continue;
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
