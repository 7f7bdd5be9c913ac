import "server-only";
import { sql } from "drizzle-orm";
import type { LineageEdge, LineageGraph, LineageNode, StageKind } from "@/domain/lineage-layout";
import { lots } from "@/db/schema";
import { getDb } from "../platform/db";
import { notFound } from "../platform/errors";
import { findLotId, visibleTo } from "../ledger/lots";
import type { SessionUser } from "../accounts/session";

// Pairs whose edges net to nothing were linked by an event that was later reversed.
const NET = sql.raw(`(select abs(sum(x.weight)) from lineage_edges x where x.parent_lot_id = e.parent_lot_id and x.child_lot_id = e.child_lot_id) > 1e-9`);

type Reach = { role: "up" | "down" | "mixed"; id: number };

/**
 * The lot's whole ancestry and whole descent, and what was mixed into its descendants
 * (the other inputs of each descendant, one step back: a recall needs to know what the
 * lot was blended with). Breadth-first inside SQLite, so a cap keeps the nearest lots.
 */
function reach(rootId: number, cap: number): Reach[] {
  return getDb().all<Reach>(sql`
    with recursive
      up(id) as (
        select ${rootId}
        union
        select e.parent_lot_id from lineage_edges e join up on e.child_lot_id = up.id where ${NET}
        limit ${cap}),
      down(id) as (
        select ${rootId}
        union
        select e.child_lot_id from lineage_edges e join down on e.parent_lot_id = down.id where ${NET}
        limit ${cap}),
      mixed(id) as (
        select distinct e.parent_lot_id from lineage_edges e join down on e.child_lot_id = down.id
        where down.id <> ${rootId} and ${NET}
          and e.parent_lot_id not in (select id from up union select id from down))
    select 'up' as role, id from up where id <> ${rootId}
    union all select 'down', id from down where id <> ${rootId}
    union all select 'mixed', id from mixed`);
}

/** Nearest first from each side, alternately, until the cap; the lot itself always. */
function pickIds(rootId: number, found: Reach[], max: number): { ids: number[]; truncated: boolean } {
  const side = (role: Reach["role"]) => found.filter((r) => r.role === role).map((r) => r.id);
  const [up, down, mixed] = [side("up"), side("down"), side("mixed")];
  const ids: number[] = [rootId];
  for (let n = 0; ids.length < max && (n < up.length || n < down.length); n++) {
    if (n < up.length) ids.push(up[n]!);
    if (n < down.length && ids.length < max) ids.push(down[n]!);
  }
  for (const id of mixed) if (ids.length < max) ids.push(id);
  return { ids, truncated: ids.length < found.length + 1 };
}

type LotRow = { id: number; code: string; kind: StageKind; unit: string; quantity: number; onHand: number; variety: string | null; grade: string | null; ratio: number | null; tankName: string | null; fieldId: string | null; fieldName: string | null; areaHa: number | null; visible: number };

function lotRows(actor: SessionUser, ids: number[]): LotRow[] {
  const seen = visibleTo(actor) ?? sql`1`;
  return getDb().all<LotRow>(sql`
    select lots.id, lots.code, lots.kind, lots.unit, lots.quantity_in as quantity, lots.on_hand as onHand, lots.variety, lots.grade,
      lots.polishing_ratio_pct as ratio, json_extract(lots.attributes, '$.tankName') as tankName,
      f.id as fieldId, f.name as fieldName, f.area_ha as areaHa, case when ${seen} then 1 else 0 end as visible
    from ${lots} left join fields f on f.id = lots.field_id
    where lots.id in (select value from json_each(${JSON.stringify(ids)}))
    order by lots.id`);
}

type EdgeRow = { parent: number; child: number; share: number; quantity: number | null };

/**
 * Net edges among the chosen lots. Share: summed weights over the child's content_in.
 * Quantity: what each event drew from the parent, split over that event's outputs by
 * the weight each received; a correction's negated edges point back at the event they
 * reverse (events.corrects), so both cancel.
 */
function edgeRows(ids: number[]): EdgeRow[] {
  const set = JSON.stringify(ids);
  return getDb().all<EdgeRow>(sql`
    with per_event as (
      select coalesce(ev.corrects, e.event_id) as src, e.parent_lot_id as parent, e.child_lot_id as child, sum(e.weight) as w
      from lineage_edges e join events ev on ev.id = e.event_id
      where e.child_lot_id in (select value from json_each(${set})) and e.parent_lot_id in (select value from json_each(${set}))
      group by 1, 2, 3)
    select p.parent, p.child, sum(p.w) / max(c.content_in, 1e-12) as share,
      sum(p.w * (select sum(i.quantity) from event_inputs i where i.event_id = p.src and i.lot_id = p.parent and i.use = 'draw')
             / (select sum(x.weight) from lineage_edges x where x.event_id = p.src and x.parent_lot_id = p.parent)) as quantity
    from per_event p join lots c on c.id = p.child
    group by p.parent, p.child
    having abs(sum(p.w)) > 1e-9
    order by p.parent, p.child`);
}

const lotNodeId = (row: LotRow, hidden: Map<number, string>) => hidden.get(row.id) ?? `lot-${row.id}`;

function toNode(row: LotRow, id: string): LineageNode {
  if (!row.visible) return { id, code: null, kind: row.kind, label: null, detail: null, quantity: null, unit: null, onHand: null, visible: false };
  const detail = row.kind === "harvest" ? [row.variety, row.grade].filter(Boolean).join(" · ") : row.ratio !== null && row.kind === "polished" ? `${row.ratio} %` : null;
  return { id, code: row.code, kind: row.kind, label: row.tankName ?? row.code, detail: detail || null, quantity: row.quantity, unit: row.unit, onHand: row.onHand, visible: true };
}

/** Room for a blend of about 500 lots, drawn whole with its stages grouped (bench/JOBS.md times it). */
export const GRAPH_MAX_NODES = 600;

/**
 * The lineage graph of a lot, paddy to bottle, for drawing. Lots the viewer may not see
 * stay in the graph (the shape of the flow is not theirs to lose) but carry no code, no
 * quantities and an id that says nothing; their paddies are left out.
 */
export function lineageGraph(actor: SessionUser, code: string, { maxNodes = GRAPH_MAX_NODES }: { maxNodes?: number } = {}): LineageGraph {
  const rootId = findLotId(actor, code);
  if (rootId === null) throw notFound({ key: "errors.lotNotFound", values: { code } });
  const { ids, truncated } = pickIds(rootId, reach(rootId, maxNodes + 1), maxNodes);
  const rows = lotRows(actor, ids);
  const hidden = new Map(rows.filter((r) => !r.visible).map((r, n) => [r.id, `hidden-${n + 1}`]));
  const byId = new Map(rows.map((r) => [r.id, r]));
  const nodes = rows.map((r) => toNode(r, lotNodeId(r, hidden)));
  const edges: LineageEdge[] = edgeRows(ids).map((e) => {
    const parent = byId.get(e.parent)!;
    return { source: lotNodeId(parent, hidden), target: lotNodeId(byId.get(e.child)!, hidden), share: e.share, quantity: parent.visible ? e.quantity : null, unit: parent.visible ? parent.unit : null };
  });
  let dropped = false;
  const fieldsAdded = new Set<string>();
  for (const r of rows) {
    if (r.kind !== "harvest" || !r.visible || !r.fieldId) continue;
    const id = `field-${r.fieldId}`;
    if (!fieldsAdded.has(id)) {
      if (nodes.length >= maxNodes) { dropped = true; continue; }
      fieldsAdded.add(id);
      nodes.push({ id, code: null, kind: "field", label: r.fieldName, detail: null, quantity: r.areaHa, unit: "ha", onHand: null, visible: true });
    }
    // A harvest lot is all from its one paddy; the edge carries the brown rice registered.
    if (fieldsAdded.has(id)) edges.push({ source: id, target: `lot-${r.id}`, share: 1, quantity: r.quantity, unit: r.unit });
  }
  return { rootId: `lot-${rootId}`, nodes, edges, truncated: truncated || dropped };
}
