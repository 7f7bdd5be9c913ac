import type { LotKind } from "./steps";

/** A lot kind, or the paddy (field) a harvest lot was grown on. */
export type StageKind = LotKind | "field";

export type LineageNode = {
  id: string;
  /** Null for a paddy and for a lot the viewer may not see. */
  code: string | null;
  kind: StageKind;
  /** The code, a tank's name or a paddy's name; null when hidden. */
  label: string | null;
  /** Variety and grade, polishing ratio: what tells two lots of a kind apart. */
  detail: string | null;
  quantity: number | null;
  unit: string | null;
  onHand: number | null;
  visible: boolean;
};

/** `share`: part of the target's content that came along this edge; `quantity`: what was drawn, in `unit`. */
export type LineageEdge = { source: string; target: string; share: number | null; quantity: number | null; unit: string | null };

export type LineageGraph = { rootId: string; nodes: LineageNode[]; edges: LineageEdge[]; truncated: boolean };

/** The order of the trade's stages, paddy to bottle (../shared/product.md, "The model"). */
export const STAGE_ORDER: readonly StageKind[] = ["field", "harvest", "polished", "bran", "soaked", "steamed", "koji", "starter", "tank", "sake", "lees", "blend", "bottled"];

/**
 * The column each stage is placed in at the earliest. Gaps leave room for the steps that
 * stay within a kind (steamed rice split into portions) so that koji, starter and tank
 * still line up; by-products share the column of their main product's neighbour.
 */
const STAGE_COLUMN: Record<StageKind, number> = {
  field: 0, harvest: 1, polished: 2, bran: 3, soaked: 3, steamed: 4, koji: 6, starter: 7, tank: 8, sake: 9, lees: 10, blend: 10, bottled: 11,
};

/**
 * Graphs larger than this start with every stage folded, the current lot excepted: one
 * node per stage and step with its count, few enough to fit the view at a zoom whose
 * labels can be read (a 500-lot blend draws as 12 stage columns instead of 169 nodes).
 */
export const LARGE_GRAPH_NODES = 60;

export function defaultCollapsed(nodeCount: number): Set<StageKind> {
  return new Set<StageKind>(nodeCount > LARGE_GRAPH_NODES ? STAGE_ORDER : []);
}

/** How many lots each stage holds, in stage order, leaving out the stages with none. */
export function stageCounts(nodes: Pick<LineageNode, "kind">[]): (readonly [StageKind, number])[] {
  const count = new Map<StageKind, number>();
  for (const n of nodes) count.set(n.kind, (count.get(n.kind) ?? 0) + 1);
  return STAGE_ORDER.filter((kind) => count.has(kind)).map((kind) => [kind, count.get(kind)!] as const);
}

/**
 * Layer of each node: never before its stage's column and always after each of its
 * parents (longest path, Kahn's order). Nodes caught in a cycle, which the ledger
 * cannot make, keep their stage's column.
 */
export function assignLayers(nodes: Pick<LineageNode, "id" | "kind">[], edges: Pick<LineageEdge, "source" | "target">[]): Map<string, number> {
  const layer = new Map(nodes.map((n) => [n.id, STAGE_COLUMN[n.kind]]));
  const indegree = new Map(nodes.map((n) => [n.id, 0]));
  const children = new Map<string, string[]>();
  for (const e of edges) {
    if (!layer.has(e.source) || !layer.has(e.target)) continue;
    indegree.set(e.target, indegree.get(e.target)! + 1);
    children.set(e.source, [...(children.get(e.source) ?? []), e.target]);
  }
  const ready = nodes.filter((n) => indegree.get(n.id) === 0).map((n) => n.id);
  while (ready.length) {
    const id = ready.shift()!;
    for (const child of children.get(id) ?? []) {
      layer.set(child, Math.max(layer.get(child)!, layer.get(id)! + 1));
      indegree.set(child, indegree.get(child)! - 1);
      if (indegree.get(child) === 0) ready.push(child);
    }
  }
  return layer;
}

export type StageNode = LineageNode & { layer: number; count: number; members: string[]; current: boolean };
export type StageEdge = LineageEdge & { id: string };
export type StageGraph = { nodes: StageNode[]; edges: StageEdge[] };

/**
 * Folds every collapsed stage into one node per layer ("4 soaked lots"), the current lot
 * excepted. Edges between the same two nodes merge: quantities add (one kind, one unit),
 * and shares add where the target is a single lot, which keeps "shares into a lot sum
 * to 1"; into a folded node a share has no single denominator and is left out.
 */
export function collapseStages(graph: LineageGraph, collapsed: ReadonlySet<StageKind>): StageGraph {
  const layers = assignLayers(graph.nodes, graph.edges);
  const repOf = new Map<string, string>();
  const groups = new Map<string, StageNode>();
  const nodes: StageNode[] = [];
  for (const n of graph.nodes) {
    const layer = layers.get(n.id)!;
    const current = n.id === graph.rootId;
    if (!collapsed.has(n.kind) || current) {
      nodes.push({ ...n, layer, count: 1, members: [n.id], current });
      repOf.set(n.id, n.id);
      continue;
    }
    const id = `group:${n.kind}:${layer}`;
    repOf.set(n.id, id);
    const group = groups.get(id);
    if (group) {
      group.count += 1;
      group.members.push(n.id);
      group.visible ||= n.visible;
      group.quantity = group.quantity !== null && n.quantity !== null ? group.quantity + n.quantity : null;
      group.onHand = group.onHand !== null && n.onHand !== null ? group.onHand + n.onHand : null;
      continue;
    }
    // A folded node is drawn as hidden only when every lot in it is hidden from the viewer.
    const created: StageNode = { ...n, id, code: null, label: null, detail: null, layer, count: 1, members: [n.id], current: false };
    groups.set(id, created);
    nodes.push(created);
  }
  return { nodes, edges: rewire(graph.edges, repOf, groups) };
}

function rewire(edges: LineageEdge[], repOf: Map<string, string>, groups: Map<string, StageNode>): StageEdge[] {
  const merged = new Map<string, StageEdge>();
  for (const e of edges) {
    const source = repOf.get(e.source);
    const target = repOf.get(e.target);
    if (!source || !target || source === target) continue;
    const id = `${source}->${target}`;
    const into = groups.has(target) ? null : e.share;
    const seen = merged.get(id);
    if (!seen) {
      merged.set(id, { id, source, target, share: into, quantity: e.quantity, unit: e.unit });
      continue;
    }
    seen.share = seen.share !== null && into !== null ? seen.share + into : null;
    seen.quantity = seen.quantity !== null && e.quantity !== null && seen.unit === e.unit ? seen.quantity + e.quantity : null;
  }
  return [...merged.values()];
}

export type ReadingItem = { node: LineageNode; layer: number; current: boolean; from: { edge: LineageEdge; source: LineageNode }[] };

/** The graph as text, paddies first: by layer, then stage, then label; each lot with what it was made from. */
export function readingOrder(graph: LineageGraph): ReadingItem[] {
  const layers = assignLayers(graph.nodes, graph.edges);
  const byId = new Map(graph.nodes.map((n) => [n.id, n]));
  const stage = (n: LineageNode) => STAGE_ORDER.indexOf(n.kind);
  return [...graph.nodes]
    .sort((a, b) => layers.get(a.id)! - layers.get(b.id)! || stage(a) - stage(b) || (a.label ?? "~").localeCompare(b.label ?? "~") || a.id.localeCompare(b.id))
    .map((node) => ({
      node,
      layer: layers.get(node.id)!,
      current: node.id === graph.rootId,
      from: graph.edges.filter((e) => e.target === node.id && byId.has(e.source)).map((edge) => ({ edge, source: byId.get(edge.source)! })),
    }));
}
