import "server-only";
import { sql } from "drizzle-orm";
import { getDb, getSqlite } from "../platform/db";

/**
 * Every lot's kind and content and every lineage edge, in memory, for reading lineages: a
 * blend of blends has 20,000 lots behind it, and reading them from SQLite a step at a time took
 * 60 ms where reading them from here takes 11. Loaded on first use (76,513 lots and 304,975 edges
 * of the bench's ledger in 0.3–0.5 s) and kept current from what the ledger records after its
 * mark, as a kept lineage is: lots are only added, edges only added (a reversal is one more edge),
 * a lot's kind never changes and its content only with an event that comes out of it or draws
 * from it. After more than CHECK_AT_MOST rows at once (a large import) it is loaded anew.
 *
 * A lot's edges are kept in the order the child index gives them (lineage_child_idx: by parent,
 * then weight, then id), the order a read from SQLite gives, so that sums add up alike.
 */
export type EdgeIndex = {
  sqlite: ReturnType<typeof getSqlite>;
  mark: LedgerMark;
  /** Lots with ids below `size` are known; kind 0 is a lot that does not exist. */
  size: number;
  kind: Uint8Array;
  content: Float64Array;
  /** The edges loaded, by child id: from `first[id]` to `first[id + 1]`. */
  first: Int32Array;
  parent: Int32Array;
  weight: Float64Array;
  /** Lots given edges since the load: all their edges, in the child index's order. */
  patched: Map<number, { parents: number[]; weights: number[] }>;
  patchedEdges: number;
};

/**
 * How far the ledger has come: its last event, edge and attachment. Lineages look at the first two
 * only (an attachment moves no rice); the figures kept across requests look at all three.
 */
export type LedgerMark = { event: number; edge: number; attachment: number };

/** Kinds by code, and codes by kind; code 0 is "no such lot". */
const kindNames: string[] = [""];
const kindCodes = new Map<string, number>();
/** A kind's code, given one on first sight; and the kind of a code. */
export const codeOf = (kind: string) => kindCodes.get(kind) ?? (kindCodes.set(kind, kindNames.length), kindNames.push(kind), kindNames.length - 1);
export const kindNamed = (code: number) => kindNames[code]!;

/** More rows recorded than this since the mark, or more edges patched, and the index is loaded anew. */
export const CHECK_AT_MOST = 20_000;
const PATCHED_AT_MOST = 100_000;

let index: EdgeIndex | undefined;

export function ledgerMark(): LedgerMark {
  const row = getDb().get<{ e: number | null; l: number | null; a: number | null }>(
    sql`select (select max(id) from events) as e, (select max(id) from lineage_edges) as l, (select max(id) from attachments) as a`,
  );
  return { event: row?.e ?? 0, edge: row?.l ?? 0, attachment: row?.a ?? 0 };
}

/**
 * The lots touched since `seen`: out of, drawn from, or linked into by what was recorded after it
 * (and the lots `more` names: further parts of the UNION ALL, each starting "union all select").
 * UNION ALL, so that each part reads only the rows after the mark by its own index: a UNION's
 * de-duplication made SQLite scan all three tables in lot order instead (87 ms against 0.1).
 */
export const touchedSince = (seen: LedgerMark, more = sql``) => sql`
  select json_group_array(lot_id) as lots, count(*) as n from (
    select lot_id from event_outputs where event_id > ${seen.event}
    union all select lot_id from event_inputs where event_id > ${seen.event}
    union all select child_lot_id from lineage_edges where id > ${seen.edge}${more})`;

function load(now: LedgerMark): EdgeIndex {
  const lots = getDb().get<{ ids: string; kinds: string; contents: string }>(sql`
    select json_group_array(id) as ids, json_group_array(kind) as kinds, json_group_array(content_in) as contents from lots`)!;
  const ids = JSON.parse(lots.ids) as number[];
  const size = ids.reduce((a, id) => Math.max(a, id + 1), 1);
  const [kind, content] = [new Uint8Array(size), new Float64Array(size)];
  const kinds = JSON.parse(lots.kinds) as string[];
  const contents = JSON.parse(lots.contents) as number[];
  ids.forEach((id, n) => ((kind[id] = codeOf(kinds[n]!)), (content[id] = contents[n]!)));
  // Read through the child index, whose order the ORDER BY names: no sort is made.
  const edges = getDb().get<{ children: string; parents: string; weights: string }>(sql`
    select json_group_array(child_lot_id) as children, json_group_array(parent_lot_id) as parents, json_group_array(weight) as weights
    from (select child_lot_id, parent_lot_id, weight from lineage_edges order by child_lot_id, parent_lot_id, weight, id)`)!;
  const children = JSON.parse(edges.children) as number[];
  const first = new Int32Array(size + 1);
  for (const child of children) first[child + 1]!++;
  for (let id = 0; id < size; id++) first[id + 1]! += first[id]!;
  return {
    sqlite: getSqlite(),
    mark: now,
    size,
    kind,
    content,
    first,
    parent: Int32Array.from(JSON.parse(edges.parents) as number[]),
    weight: Float64Array.from(JSON.parse(edges.weights) as number[]),
    patched: new Map(),
    patchedEdges: 0,
  };
}

/** A typed array copied into a longer one of the same kind. */
export function grown<A extends Int32Array | Uint8Array | Float64Array>(array: A, length: number): A {
  const bigger = new (array.constructor as new (length: number) => A)(length);
  bigger.set(array);
  return bigger;
}

/** The lots added since the index last looked, with their kinds and contents. */
function addLots(at: EdgeIndex) {
  const added = getDb().all<{ id: number; kind: string; contentIn: number }>(sql`select id, kind, content_in as contentIn from lots where id >= ${at.size}`);
  if (!added.length) return;
  const size = added.reduce((a, l) => Math.max(a, l.id + 1), at.size);
  const room = Math.max(size, Math.ceil(at.size * 1.25));
  if (room > at.kind.length) (at.kind = grown(at.kind, room)), (at.content = grown(at.content, room));
  // The edges loaded end where they ended: the new lots have none there.
  if (room + 1 > at.first.length) {
    const first = grown(at.first, room + 1);
    first.fill(at.first[at.first.length - 1]!, at.first.length);
    at.first = first;
  }
  for (const l of added) (at.kind[l.id] = codeOf(l.kind)), (at.content[l.id] = l.contentIn);
  at.size = size;
}

/** The index as the ledger stands at `now`; called inside the caller's read, so that the two agree. */
export function edgeIndexAt(now: LedgerMark): EdgeIndex {
  const sqlite = getSqlite();
  if (!index || index.sqlite !== sqlite) return (index = load(now));
  const seen = index.mark;
  if (seen.event === now.event && seen.edge === now.edge) return index;
  const touched = getDb().get<{ lots: string; n: number }>(touchedSince(seen))!;
  if (touched.n > CHECK_AT_MOST || index.patchedEdges > PATCHED_AT_MOST) return (index = load(now));
  addLots(index);
  const lots = [...new Set(JSON.parse(touched.lots) as number[])];
  for (const { id, contentIn } of getDb().all<{ id: number; contentIn: number }>(sql`
    select id, content_in as contentIn from lots where id in (select value from json_each(${JSON.stringify(lots)}))`))
    index.content[id] = contentIn;
  const added = getDb().all<{ child: number; parent: number; weight: number }>(sql`
    select child_lot_id as child, parent_lot_id as parent, weight from lineage_edges where id > ${seen.edge} and id <= ${now.edge} order by id`);
  for (const e of added) {
    const own = edgesOf(index, e.child);
    const merged: { parent: number; weight: number }[] = [];
    for (let n = own.from; n < own.to; n++) merged.push({ parent: own.parents[n]!, weight: own.weights[n]! });
    // After the old ones on a tie (parent and weight alike), as the index puts a higher id.
    merged.push({ parent: e.parent, weight: e.weight });
    merged.sort((a, b) => a.parent - b.parent || a.weight - b.weight);
    index.patched.set(e.child, { parents: merged.map((m) => m.parent), weights: merged.map((m) => m.weight) });
    index.patchedEdges++;
  }
  index.mark = now;
  return index;
}

/** A lot's edges, in the child index's order: `parents` and `weights` from `from` to `to`. */
export function edgesOf(at: EdgeIndex, child: number): { parents: ArrayLike<number>; weights: ArrayLike<number>; from: number; to: number } {
  const patched = at.patched.get(child);
  if (patched) return { ...patched, from: 0, to: patched.parents.length };
  if (child >= at.size || child + 1 >= at.first.length) return { parents: at.parent, weights: at.weight, from: 0, to: 0 };
  return { parents: at.parent, weights: at.weight, from: at.first[child]!, to: at.first[child + 1]! };
}

/** A lot's kind, or null when there is no such lot. */
export const kindOf = (at: EdgeIndex, id: number): string | null => (id < at.size && at.kind[id]! > 0 ? kindNames[at.kind[id]!]! : null);

export const contentOf = (at: EdgeIndex, id: number): number => at.content[id]!;
