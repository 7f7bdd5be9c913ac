import "server-only";
import { sql } from "drizzle-orm";
import { getDb, getSqlite } from "../platform/db";
import { KeptByLot } from "./kept-by-lot";
import { CHECK_AT_MOST, codeOf, contentOf, edgeIndexAt, edgesOf, grown, kindNamed, kindOf, ledgerMark, touchedSince, type EdgeIndex, type LedgerMark } from "./edge-index";

/** A lot behind another; code, attributes and polishing ratio are read for tanks and polished lots only. */
export type AncestorLot = { id: number; code: string; kind: string; contentIn: number; attributes: string | null; polishingRatioPct: number | null };

type Lineage = {
  /** Each lot's place by id, plus one (0: not in the lineage); as long as the ledger's lot ids when read. */
  at: Int32Array;
  /** Lots by place (ids, kinds, contents) and each lot's recorded edges as a slice of `parent`/`weight` (from `first[n]` to `first[n + 1]`). */
  ids: number[];
  kinds: string[];
  /** The kinds as the edge index codes them. */
  kindCodes: Uint8Array;
  contents: number[];
  first: Int32Array;
  parent: Int32Array;
  weight: Float64Array;
  /** Tanks and polished lots, whose codes and figures are read with every answer. */
  described: number[];
  /** Walks already made over this lineage, by start and stop kinds. */
  walks: Map<string, Walk>;
  /** Per-lot counters of a walk, made once per lineage and cleared after each walk (a blend's 144 tanks are 288 walks). */
  scratch: { waiting: Int32Array; seen: Uint8Array; share: Float64Array; given: Uint8Array; todo: Int32Array; touched: Int32Array; reached: Int32Array; goes: Map<string, Uint8Array> };
};

/**
 * A walk up from a lot: the lots it reached, by place in the lineage, in the order each was first
 * given a share, and the fraction of the lot's content each gave. Two typed arrays rather than a
 * Map: a blend's walk reaches 20,000 lots, and a Map of them cost more than the walk.
 */
export type Walk = { places: Int32Array; shares: Float64Array };

/** The distinct lots behind a lot and the edges among them, with the tanks' and polished lots' current details. */
export type Ancestry = Lineage & {
  details: Map<number, { code: string; attributes: string | null; polishingRatioPct: number | null }>;
  /** The ledger the lineage is true of; null when it was read inside a caller's transaction, which may yet be rolled back. */
  mark: LedgerMark | null;
};

/** A lot's place in a lineage, or -1. */
const placeOf = (at: Int32Array, id: number) => (id < at.length ? at[id]! - 1 : -1);

/** A lot of the lineage with its kind and content, or undefined. */
export function lotOf(lineage: Lineage, id: number): { kind: string; contentIn: number } | undefined {
  const n = placeOf(lineage.at, id);
  return n < 0 ? undefined : { kind: lineage.kinds[n]!, contentIn: lineage.contents[n]! };
}

/**
 * Lots as a lineage is read, by place (ids, kind codes, contents), and their edges (parents by
 * place) in the order read: typed arrays that grow by half as they fill. A blend of blends has
 * 20,000 lots and 34,000 edges behind it; JS arrays pushed one by one took twice as long.
 */
class Found {
  lots = 0;
  edges = 0;
  ids: Int32Array;
  kinds: Uint8Array;
  contents: Float64Array;
  /** Where each lot's edges begin, and one more after the last lot read. */
  first: Int32Array;
  parents: Int32Array;
  weights: Float64Array;

  constructor(
    public at: Int32Array,
    lots = 256,
    edges = 512,
  ) {
    [this.ids, this.kinds, this.contents, this.first] = [new Int32Array(lots), new Uint8Array(lots), new Float64Array(lots), new Int32Array(lots + 1)];
    [this.parents, this.weights] = [new Int32Array(edges), new Float64Array(edges)];
  }

  /** Places a lot after the others: its place. */
  place(id: number, kind: number, contentIn: number): number {
    if (id >= this.at.length) this.at = grown(this.at, Math.ceil((id + 1) * 1.25));
    if (this.lots === this.ids.length) {
      const room = Math.ceil(this.lots * 1.5) + 16;
      [this.ids, this.kinds, this.contents, this.first] = [grown(this.ids, room), grown(this.kinds, room), grown(this.contents, room), grown(this.first, room + 1)];
    }
    const n = this.lots++;
    this.at[id] = n + 1;
    this.ids[n] = id;
    this.kinds[n] = kind;
    this.contents[n] = contentIn;
    return n;
  }

  edge(parent: number, weight: number) {
    if (this.edges === this.parents.length) {
      const room = Math.ceil(this.edges * 1.5) + 16;
      [this.parents, this.weights] = [grown(this.parents, room), grown(this.weights, room)];
    }
    this.parents[this.edges] = parent;
    this.weights[this.edges++] = weight;
  }

  /** The place of a lot already placed, or -1. */
  placeOf(id: number) {
    return id < this.at.length ? this.at[id]! - 1 : -1;
  }
}

/** Lots with no content, and harvest lots, pass nothing on: their edges are not read. */
const passesOn = (kind: string, contentIn: number) => kind !== "harvest" && contentIn > 0;
const HARVEST = codeOf("harvest");

/**
 * Everything behind a lot up to its harvest lots: each lot once, however many routes lead to it
 * (a blend of blends reaches its rice by tens of thousands of paths). Lots with no content pass
 * nothing on, so the walk stops there as the fraction walks do.
 */
function readLineage(lotId: number, index: EdgeIndex): Lineage {
  const found = new Found(new Int32Array(index.size));
  if (kindOf(index, lotId)) found.place(lotId, index.kind[lotId]!, contentOf(index, lotId));
  readFrom(found, 0, index);
  return lineageOf(found);
}

/**
 * Reads the edges into the lots from place `from` on, in the order of their places, and places
 * each lot first found behind them after the others, so that the reading goes on to it: each
 * lot's edges once, as a breadth-first walk up. Every edge as recorded: a link and its reversal
 * both pass, and cancel in the sums.
 */
function readFrom(found: Found, from: number, index: EdgeIndex) {
  for (let n = from; n < found.lots; n++) {
    found.first[n] = found.edges;
    if (found.kinds[n] !== HARVEST && found.contents[n]! > 0) readEdgesOf(found, found.ids[n]!, index);
  }
  found.first[found.lots] = found.edges;
}

/** A lot's edges as the index holds them, each parent placed if it is first found. */
function readEdgesOf(found: Found, id: number, index: EdgeIndex) {
  const { parents, weights, from, to } = edgesOf(index, id);
  for (let e = from; e < to; e++) {
    const parent = parents[e]!;
    const p = found.placeOf(parent);
    found.edge(p < 0 ? found.place(parent, index.kind[parent]!, index.content[parent]!) : p, weights[e]!);
  }
}

/**
 * The same reading from SQLite itself, a step up at a time, for a caller inside a transaction of
 * its own (a bottling checks the claims of the sake it bottles): what it reads may yet be rolled
 * back, so neither the edge index nor a kept lineage may take it in. Each lot's edges in the
 * child index's order, named, and the lots placed as `readFrom` places them.
 */
function readFromDatabase(found: Found) {
  for (let start = 0; start < found.lots; ) {
    const end = found.lots;
    const open: number[] = [];
    for (let n = start; n < end; n++) if (found.kinds[n] !== HARVEST && found.contents[n]! > 0) open.push(found.ids[n]!);
    const rows = getDb().all<{ child: number; parent: number; weight: number; kind: string; contentIn: number }>(sql`
      select e.child_lot_id as child, e.parent_lot_id as parent, e.weight, p.kind, p.content_in as contentIn
      from json_each(${JSON.stringify(open)}) c join lineage_edges e on e.child_lot_id = c.value join lots p on p.id = e.parent_lot_id
      order by c.key, e.parent_lot_id, e.weight, e.id`);
    let r = 0;
    for (let n = start; n < end; n++) {
      found.first[n] = found.edges;
      for (; r < rows.length && rows[r]!.child === found.ids[n]; r++) {
        const row = rows[r]!;
        const p = found.placeOf(row.parent);
        found.edge(p < 0 ? found.place(row.parent, codeOf(row.kind), row.contentIn) : p, row.weight);
      }
    }
    start = end;
  }
  found.first[found.lots] = found.edges;
}

function readLineageFromDatabase(lotId: number): Lineage {
  const head = getDb().get<{ kind: string; contentIn: number }>(sql`select kind, content_in as contentIn from lots where id = ${lotId}`);
  const found = new Found(new Int32Array(lotId + 1));
  if (head) found.place(lotId, codeOf(head.kind), head.contentIn);
  readFromDatabase(found);
  return lineageOf(found);
}

/**
 * The lineage of what was read: each lot's edges in the order read, so that the sums add up in
 * the same order every time. That order is the child index's (lineage_child_idx: parent, then
 * weight, then id), which is how SQLite finds a lot's edges and how the edge index keeps them;
 * `broughtUp` keeps it too.
 */
function lineageOf(found: Found): Lineage {
  const count = found.lots;
  const [ids, kinds, contents] = [new Array<number>(count), new Array<string>(count), new Array<number>(count)];
  const described: number[] = [];
  for (let n = 0; n < count; n++) {
    const [id, kind] = [found.ids[n]!, kindNamed(found.kinds[n]!)];
    ids[n] = id;
    kinds[n] = kind;
    contents[n] = found.contents[n]!;
    if (kind === "tank" || kind === "polished") described.push(id);
  }
  const scratch = {
    waiting: new Int32Array(count), seen: new Uint8Array(count), share: new Float64Array(count), given: new Uint8Array(count),
    todo: new Int32Array(count), touched: new Int32Array(count), reached: new Int32Array(count), goes: new Map(),
  };
  return {
    at: found.at, ids, kinds, kindCodes: found.kinds.slice(0, count), contents,
    first: found.first.slice(0, count + 1), parent: found.parents.slice(0, found.edges), weight: found.weights.slice(0, found.edges),
    described, walks: new Map(), scratch,
  };
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
/**
 * The lineage read at `seen` as a read now would give it, or null when it must be read anew.
 * Only the kinds and contents of its lots and the edges into them make it. So an event that
 * touched none of its lots keeps it, and so does one that touched some without changing those
 * (a shipment or a sample draws from a bottling without changing what went into it). Otherwise
 * the lots given new edges take their edges from the edge index (in the order a read gives), the
 * lots first found behind them are read with their own lineage, and contents are taken as they
 * are now; the walks made over lots nothing changed are kept, so that a new edge into a bottling
 * does not walk its 144 tanks again. Read anew: when more was recorded than is worth checking, or
 * a lot of it began or stopped passing rice on (its content went to or from nothing), which
 * changes which lots a read reaches.
 */
function broughtUp(lineage: Lineage, seen: LedgerMark, now: LedgerMark, index: EdgeIndex): Lineage | null {
  if (seen.event === now.event && seen.edge === now.edge) return lineage;
  const row = getDb().get<{ lots: string; n: number }>(touchedSince(seen))!;
  if (row.n > CHECK_AT_MOST) return null;
  const hit = [...new Set(JSON.parse(row.lots) as number[])].filter((id) => placeOf(lineage.at, id) >= 0);
  if (!hit.length) return lineage;
  const contents = lineage.contents.slice();
  const changed = new Set<number>();
  for (const id of hit) {
    const [n, contentIn] = [placeOf(lineage.at, id), contentOf(index, id)];
    if (contents[n] === contentIn) continue;
    if (passesOn(lineage.kinds[n]!, contents[n]!) !== passesOn(lineage.kinds[n]!, contentIn)) return null;
    contents[n] = contentIn;
    changed.add(id);
  }
  // Edges are only added, so a lot has new ones when the index holds more for it than the lineage
  // read. A read takes no edge into a lot that passes nothing on.
  const relisted = new Set(
    hit.filter((id) => {
      const n = placeOf(lineage.at, id);
      const into = edgesOf(index, id);
      return passesOn(lineage.kinds[n]!, contents[n]!) && into.to - into.from !== lineage.first[n + 1]! - lineage.first[n]!;
    }),
  );
  if (!changed.size && !relisted.size) return lineage;
  for (const id of relisted) changed.add(id);
  const updated = spliced(lineage, contents, relisted, index);
  // A walk depends only on the lots it reached: kept while none of them changed. The places of
  // the lots read before are kept, so a kept walk reads as it did.
  const moved = new Uint8Array(lineage.ids.length);
  for (const id of changed) moved[placeOf(lineage.at, id)] = 1;
  for (const [key, walk] of lineage.walks) if (!walk.places.some((n) => moved[n] === 1)) updated.walks.set(key, walk);
  return updated;
}

/**
 * `lineage` with its contents as they are now, the lots given new edges (`relisted`) with their
 * edges as the index now holds them (in the child index's order), and the lots first found
 * behind those read with their own lineage. Its lots keep their places (the new ones come after
 * them) and the others their edges.
 */
function spliced(lineage: Lineage, contents: number[], relisted: Set<number>, index: EdgeIndex): Lineage {
  const old = lineage.ids.length;
  const found = new Found(new Int32Array(Math.max(index.size, lineage.at.length)), old + 256, lineage.parent.length + 512);
  found.at.set(lineage.at);
  found.ids.set(lineage.ids), found.kinds.set(lineage.kindCodes), found.contents.set(contents);
  found.lots = old;
  for (let n = 0; n < old; n++) {
    found.first[n] = found.edges;
    if (relisted.has(found.ids[n]!)) readEdgesOf(found, found.ids[n]!, index);
    else for (let e = lineage.first[n]!; e < lineage.first[n + 1]!; e++) found.edge(lineage.parent[e]!, lineage.weight[e]!);
  }
  readFrom(found, old, index);
  return lineageOf(found);
}

/**
 * Reads made as one: every statement sees the ledger as it stood at the mark, so no edge is
 * taken twice by a lineage brought up to date (once read, once as new) when another process
 * writes meanwhile, and the edge index agrees with the rest. Nested in a caller's transaction
 * it is a savepoint.
 */
let snapshot: { sqlite: ReturnType<typeof getSqlite>; read: (lotId: number, anew: boolean) => Read } | undefined;
type Read = { lineage: Lineage; mark: LedgerMark };

function lineageNow(lotId: number, anew: boolean): Read {
  const sqlite = getSqlite();
  // Another database (a test's own file): nothing kept from the one before holds there.
  if (snapshot?.sqlite !== sqlite) snapshot = { sqlite, read: sqlite.transaction((id: number, fresh: boolean) => keptOrRead(id, fresh)) }, recent.clear();
  return snapshot.read(lotId, anew);
}

function keptOrRead(lotId: number, anew: boolean): Read {
  const now = ledgerMark();
  const index = edgeIndexAt(now);
  if (anew) return { lineage: readLineage(lotId, index), mark: now };
  const kept = recent.get(lotId);
  const lineage = (kept && broughtUp(kept.lineage, kept.seen, now, index)) ?? readLineage(lotId, index);
  recent.delete(lotId);
  recent.set(lotId, { seen: now, lineage });
  if (recent.size > KEEP) recent.delete(recent.keys().next().value!);
  return { lineage, mark: now };
}

/** The lineage as a read now gives it, neither kept nor brought up to date: what the tests hold a kept one to. */
export function ancestryReadAnew(lotId: number): Ancestry {
  const { lineage, mark } = lineageNow(lotId, true);
  return withDetails(lineage, mark);
}

export function ancestryOf(lotId: number): Ancestry {
  // Inside a caller's transaction, what is read may yet be rolled back: read from SQLite, keep nothing.
  if (getSqlite().inTransaction) return withDetails(readLineageFromDatabase(lotId), null);
  const { lineage, mark } = lineageNow(lotId, false);
  return withDetails(lineage, mark);
}

type Details = { code: string; attributes: string | null; polishingRatioPct: number | null };
/** Codes, tank attributes and ratios are fixed when a lot is made: once read, kept. */
const detailsKept = new KeptByLot<Details>("lot details", 100_000);

function withDetails(lineage: Lineage, mark: LedgerMark | null): Ancestry {
  const details = detailsKept.fixedOf(lineage.described, (ids) =>
    new Map(
      getDb()
        .all<{ id: number } & Details>(sql`
          select id, code, case when kind = 'tank' then attributes end as attributes, polishing_ratio_pct as polishingRatioPct
          from lots where id in (select value from json_each(${JSON.stringify(ids)}))`)
        .map(({ id, ...d }) => [id, d]),
    ),
  );
  return { ...lineage, details, mark };
}

/**
 * The fraction of `start`'s content each lot behind it gave, walking up until lots of the
 * `stop` kinds (and harvest lots). Summed over every path, as the path-by-path walk sums, but
 * each net edge is multiplied once, in topological order; reversed edges cancel in the sums.
 */
export function fractionsUp(ancestry: Ancestry, start: number, stop: readonly string[]): Walk {
  const key = `${start}:${stop.join(",")}`;
  const made = ancestry.walks.get(key);
  if (made) return made;
  const fractions = walkUp(ancestry, start, stop);
  ancestry.walks.set(key, fractions);
  return fractions;
}

function walkUp(ancestry: Ancestry, start: number, stop: readonly string[]): Walk {
  const { at, contents, first, parent, weight } = ancestry;
  const from = placeOf(at, start);
  if (from < 0) return { places: new Int32Array(0), shares: new Float64Array(0) };
  const { waiting, seen, share, given, todo, touched, reached } = ancestry.scratch;
  // Which lots pass their share on, marked once: a lot of a `stop` kind does not, nor one that passes nothing on.
  const goes = stopping(ancestry, stop);
  // Edges counted only from lots the walk passes through, so that Kahn's order is not held back
  // by lots it never reaches. Each lot is stacked once, so the stacks fit the lineage.
  seen[from] = 1;
  let [stacked, seenCount] = [0, 0];
  todo[stacked++] = from;
  touched[seenCount++] = from;
  while (stacked > 0) {
    const n = todo[--stacked]!;
    if (!goes[n]) continue;
    for (let e = first[n]!; e < first[n + 1]!; e++) {
      const p = parent[e]!;
      waiting[p]!++;
      if (!seen[p]) (seen[p] = 1), (todo[stacked++] = p), (touched[seenCount++] = p);
    }
  }
  // Fractions by place; `reached` keeps the order each lot was first given one. `todo` is empty
  // again, and serves as the stack of lots ready.
  let reachedCount = 0;
  reached[reachedCount++] = from;
  share[from] = 1;
  given[from] = 1;
  todo[stacked++] = from;
  while (stacked > 0) {
    const n = todo[--stacked]!;
    if (!goes[n]) continue;
    const own = share[n]!;
    const contentIn = contents[n]!;
    for (let e = first[n]!; e < first[n + 1]!; e++) {
      const p = parent[e]!;
      share[p] = share[p]! + (own * weight[e]!) / contentIn;
      if (!given[p]) (given[p] = 1), (reached[reachedCount++] = p);
      if (--waiting[p]! === 0) todo[stacked++] = p;
    }
  }
  const places = reached.slice(0, reachedCount);
  const shares = new Float64Array(reachedCount);
  for (let i = 0; i < reachedCount; i++) shares[i] = share[places[i]!]!;
  for (let i = 0; i < seenCount; i++) {
    const n = touched[i]!;
    (waiting[n] = 0), (seen[n] = 0), (share[n] = 0), (given[n] = 0);
  }
  return { places, shares };
}

/** For each lot of the lineage, whether a walk stopping at `stop` kinds goes on through it; made once per lineage and stop. */
function stopping(ancestry: Ancestry, stop: readonly string[]): Uint8Array {
  const key = stop.join(",");
  const made = ancestry.scratch.goes.get(key);
  if (made) return made;
  // By kind code, in a plain loop: Uint8Array.from with a mapping function goes through the
  // iterator protocol, and it and comparing names cost a blend's first view 5 ms over 20,000 lots.
  const { kindCodes, contents } = ancestry;
  const stops = new Uint8Array(256);
  for (const kind of [...stop, "harvest"]) stops[codeOf(kind)] = 1;
  const goes = new Uint8Array(kindCodes.length);
  for (let n = 0; n < kindCodes.length; n++) goes[n] = stops[kindCodes[n]!] === 0 && contents[n]! > 0 ? 1 : 0;
  ancestry.scratch.goes.set(key, goes);
  return goes;
}

/** Lots of one kind behind `start` with the fraction they gave, as the path-by-path walk answers. */
export function lotsOfKindUp(ancestry: Ancestry, start: number, kind: "tank" | "polished"): (AncestorLot & { fraction: number })[] {
  const { places, shares } = fractionsUp(ancestry, start, [kind]);
  const found: (AncestorLot & { fraction: number })[] = [];
  places.forEach((n, i) => {
    if (ancestry.kinds[n] !== kind || !(Math.abs(shares[i]!) > 1e-9)) return;
    const id = ancestry.ids[n]!;
    found.push({ id, kind, contentIn: ancestry.contents[n]!, ...ancestry.details.get(id)!, fraction: shares[i]! });
  });
  return found.sort((a, b) => a.id - b.id);
}

/** The sum of the fractions a walk gives lots of one kind, in the order reached. */
export function shareOfKind(ancestry: Ancestry, walk: Walk, kind: string): number {
  let sum = 0;
  walk.places.forEach((n, i) => void (ancestry.kinds[n] === kind && (sum += walk.shares[i]!)));
  return sum;
}

/**
 * `start` and the lots behind it, going up only through lots of the `through` kinds (every
 * recorded edge, reversed ones too), as a recursive read of the edges would give. Null when
 * the way passes a lot whose edges the lineage did not read (one with no content).
 */
export function lotsUpThrough(ancestry: Ancestry, start: number, through: readonly string[]): number[] | null {
  const { at, ids, kinds, contents, first, parent } = ancestry;
  const from = placeOf(at, start);
  if (from < 0) return null;
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
