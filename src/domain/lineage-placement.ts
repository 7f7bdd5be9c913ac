import dagre from "@dagrejs/dagre";
import { collapseStages, defaultCollapsed, type LineageGraph, type StageEdge, type StageGraph, type StageKind, type StageNode } from "./lineage-layout";

/** Drawn sizes in px: a tank is tall, a paddy a low strip, a bottle upright. */
export const NODE_SIZE: Record<StageKind, { width: number; height: number }> = {
  field: { width: 176, height: 56 },
  harvest: { width: 132, height: 92 },
  polished: { width: 150, height: 72 },
  bran: { width: 120, height: 56 },
  soaked: { width: 144, height: 76 },
  steamed: { width: 156, height: 84 },
  koji: { width: 144, height: 76 },
  starter: { width: 120, height: 96 },
  tank: { width: 112, height: 140 },
  sake: { width: 124, height: 116 },
  lees: { width: 120, height: 64 },
  blend: { width: 124, height: 116 },
  bottled: { width: 104, height: 156 },
};

/** A folded stage is one width everywhere, so that a column of stages reads like a table. */
const GROUP_WIDTH = 120;

/**
 * Gaps between columns and between nodes. The overview (only folded stages and the current
 * lot) draws its columns close, without amounts on the arrows, so that twelve stages fit
 * a desk screen at about 0.6 and their larger labels stay legible; the amounts are in the list.
 */
const SPACING = { full: { ranksep: 128, nodesep: 32 }, overview: { ranksep: 28, nodesep: 24 } };

export const isFolded = (n: Pick<StageNode, "id">) => n.id.startsWith("group:");

/** A fresh object per node: dagre writes the position into it. */
function sizeOf(n: StageNode) {
  const size = NODE_SIZE[n.kind];
  return isFolded(n) ? { width: GROUP_WIDTH, height: Math.max(88, size.height) } : { ...size };
}

export type PlacedNode = StageNode & { x: number; y: number; width: number; height: number };
export type PlacedGraph = { nodes: PlacedNode[]; edges: StageEdge[]; width: number; height: number; overview: boolean };

/**
 * Left-to-right layered drawing with dagre. Each edge asks for at least as many ranks as
 * the layers it spans, so that stages stay in their columns as far as the graph allows.
 * Positions are the top-left corners, as @xyflow/react expects them.
 */
export function layoutStages(graph: StageGraph): PlacedGraph {
  const overview = graph.nodes.length > 1 && graph.nodes.every((n) => isFolded(n) || n.current);
  const g = new dagre.graphlib.Graph<{ rankdir: "LR" }, { width: number; height: number; x?: number; y?: number }, { minlen: number }>();
  g.setGraph({ rankdir: "LR", ...SPACING[overview ? "overview" : "full"], marginx: 16, marginy: 16 } as never);
  const layerOf = new Map(graph.nodes.map((n) => [n.id, n.layer]));
  for (const n of graph.nodes) g.setNode(n.id, sizeOf(n));
  for (const e of graph.edges) g.setEdge(e.source, e.target, { minlen: Math.max(1, layerOf.get(e.target)! - layerOf.get(e.source)!) });
  dagre.layout(g as never);
  const label = g.graph() as unknown as { width?: number; height?: number };
  const nodes = graph.nodes.map((n) => {
    const { width, height, x = 0, y = 0 } = g.node(n.id);
    return { ...n, width, height, x: x - width / 2, y: y - height / 2 };
  });
  return { nodes, edges: graph.edges, width: label.width ?? 0, height: label.height ?? 0, overview };
}

/** What the graph shows: the stages folded and where each node sits. */
export type GraphView = { folded: StageKind[]; placed: PlacedGraph };

export function placeView(graph: LineageGraph, folded: ReadonlySet<StageKind>): GraphView {
  return { folded: [...folded].sort(), placed: layoutStages(collapseStages(graph, folded)) };
}

/** The first drawing, laid out on the server so that the browser only draws it. */
export const firstView = (graph: LineageGraph) => placeView(graph, defaultCollapsed(graph.nodes.length));
