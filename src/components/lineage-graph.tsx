"use client";

import "@xyflow/react/dist/style.css";
import Link from "@/components/app-link";
import { createContext, useContext, useRef, useState, useSyncExternalStore, type ReactNode } from "react";
import { Background, Controls, Handle, MarkerType, MiniMap, Position, ReactFlow, type Edge, type Node, type NodeProps } from "@xyflow/react";
import { useFormatter, useTranslations } from "next-intl";
import { useQuantity } from "@/lib/use-quantity";
import { STAGE_ORDER, type LineageGraph, type StageKind } from "@/domain/lineage-layout";
import type { GraphView, PlacedNode } from "@/domain/lineage-placement";

type StageFlowNode = Node<{ node: PlacedNode }, StageKind>;

/**
 * Each stage has its own silhouette and colours, so that the flow reads at a glance and
 * without colour: a paddy strip with furrows, a tied sack, a grain, a cloud of steam,
 * a dotted koji tray, a jar of starter, a tall tank, a droplet of sake, a bottle.
 * Drawn on a 100 × 100 box stretched to the node; strokes keep their width.
 */
const SHAPES: Record<StageKind, { paint: string; text: string; pad: string; draw: ReactNode }> = {
  field: { paint: "fill-cedar stroke-cedar-deep", text: "text-paper", pad: "", draw: <><rect x="1" y="1" width="98" height="98" rx="20" ry="40" /><path d="M12 28 H88 M10 50 H90 M12 72 H88" fill="none" className="stroke-cedar-deep" strokeDasharray="3 4" /></> },
  harvest: { paint: "fill-husk stroke-ink-soft", text: "text-ink", pad: "pt-5", draw: <><path d="M24 4 H76 L68 20 C92 32 98 60 93 84 C89 97 11 97 7 84 C2 60 8 32 32 20 Z" /><path d="M30 20 H70" fill="none" /></> },
  polished: { paint: "fill-paper stroke-husk", text: "text-ink", pad: "", draw: <ellipse cx="50" cy="50" rx="49" ry="48" /> },
  bran: { paint: "fill-paper-deep stroke-husk", text: "text-ink-soft", pad: "", draw: <ellipse cx="50" cy="50" rx="49" ry="48" strokeDasharray="4 3" /> },
  soaked: { paint: "fill-paper-deep stroke-cedar", text: "text-ink", pad: "pt-3", draw: <path d="M1 22 Q13 12 25 22 T50 22 T75 22 T99 22 V88 Q99 99 88 99 H12 Q1 99 1 88 Z" /> },
  steamed: { paint: "fill-white stroke-ink-soft", text: "text-ink", pad: "pt-3", draw: <path d="M18 92 C2 92 0 66 14 60 C6 38 28 22 42 32 C48 6 82 8 84 32 C100 32 102 62 88 68 C98 86 80 98 66 90 C56 100 30 100 18 92 Z" /> },
  koji: { paint: "fill-koji-pale stroke-koji", text: "text-ink", pad: "", draw: <rect x="2" y="2" width="96" height="96" rx="14" strokeDasharray="0.5 6" strokeLinecap="round" strokeWidth="4" /> },
  starter: { paint: "fill-persimmon-pale stroke-persimmon", text: "text-ink", pad: "pt-8", draw: <path d="M36 2 H64 V26 C88 36 98 58 94 78 C90 97 10 97 6 78 C2 58 12 36 36 26 Z" /> },
  tank: { paint: "fill-paper-deep stroke-cedar-deep", text: "text-ink", pad: "pt-4", draw: <><path d="M1 10 C1 -2 99 -2 99 10 V90 C99 102 1 102 1 90 Z" /><path d="M1 10 C1 22 99 22 99 10 M1 30 H99 M1 84 H99" fill="none" /></> },
  sake: { paint: "fill-white stroke-cedar", text: "text-ink", pad: "pt-10", draw: <path d="M50 1 C62 24 95 48 95 70 C95 88 75 99 50 99 C25 99 5 88 5 70 C5 48 38 24 50 1 Z" /> },
  blend: { paint: "fill-koji-pale stroke-cedar-deep", text: "text-ink", pad: "pt-10", draw: <><path d="M50 1 C62 24 95 48 95 70 C95 88 75 99 50 99 C25 99 5 88 5 70 C5 48 38 24 50 1 Z" /><path d="M50 30 C70 50 30 70 50 96" fill="none" strokeDasharray="3 3" /></> },
  lees: { paint: "fill-husk stroke-ink-soft", text: "text-ink", pad: "", draw: <path d="M8 42 C8 10 48 20 60 10 C86 2 99 30 93 56 C88 86 60 97 34 91 C10 86 8 66 8 42 Z" strokeDasharray="4 3" /> },
  bottled: { paint: "fill-cedar-deep stroke-ink", text: "text-paper", pad: "pt-12", draw: <path d="M40 1 H60 V20 C60 28 92 32 92 48 V94 C92 98 88 99 84 99 H16 C12 99 8 98 8 94 V48 C8 32 40 28 40 20 Z" /> },
};

const HIDDEN_PAINT = "fill-paper-deep stroke-husk";
const ExpandContext = createContext<(kind: StageKind) => void>(() => {});

function Silhouette({ kind, paint, className = "" }: { kind: StageKind; paint: string; className?: string }) {
  return (
    <svg viewBox="0 0 100 100" preserveAspectRatio="none" className={`absolute inset-0 h-full w-full overflow-visible [&_*]:[vector-effect:non-scaling-stroke] ${paint} ${className}`} strokeWidth="2" aria-hidden="true">
      {SHAPES[kind].draw}
    </svg>
  );
}

function StageNode({ data: { node } }: NodeProps<StageFlowNode>) {
  const t = useTranslations("graph");
  const amount = useQuantity();
  const expand = useContext(ExpandContext);
  const shape = SHAPES[node.kind];
  const folded = node.id.startsWith("group:");
  const paint = node.visible ? shape.paint : `${HIDDEN_PAINT} opacity-80`;
  const title = folded ? t(`groups.${node.kind}`, { count: node.count }) : node.visible ? node.label : t("hiddenLot");
  // A folded stage is read from afar (the overview fits at about 0.6), so its words are larger.
  const body = (
    <span className={`relative flex h-full w-full flex-col items-center justify-center px-2 text-center leading-tight ${shape.pad} ${node.visible ? shape.text : "text-ink-soft"}`}>
      <span className={folded ? "text-sm font-semibold" : "text-[10px] font-semibold tracking-wide uppercase"}>{t(`kinds.${node.kind}`)}</span>
      <span className={`${folded ? "text-base" : "text-xs"} font-bold ${node.code ? "font-[family-name:var(--font-code)]" : ""}`}>{title}</span>
      {node.detail ? <span className="text-[10px]">{node.detail}</span> : null}
      {node.quantity !== null && node.unit ? <span className="text-[10px]">{amount(node.quantity, node.unit)}</span> : null}
    </span>
  );
  // React Flow turns pointer events off on nodes nobody can select or drag; the links and
  // buttons inside take them back, so a lot opens and a folded stage unfolds on a click.
  return (
    <div className="relative h-full w-full" data-kind={node.kind} data-current={node.current || undefined}>
      <Handle type="target" position={Position.Left} isConnectable={false} style={{ opacity: 0 }} />
      {folded ? <Silhouette kind={node.kind} paint={paint} className="translate-x-1.5 translate-y-1.5 opacity-60" /> : null}
      <Silhouette kind={node.kind} paint={paint} className={node.visible ? "" : "[&_*]:[stroke-dasharray:4_3]"} />
      {node.current ? <Silhouette kind={node.kind} paint="fill-none stroke-persimmon" className="scale-110" /> : null}
      {node.current ? <span className="absolute -top-6 left-1/2 -translate-x-1/2 rounded bg-persimmon px-2 text-[10px] font-bold whitespace-nowrap text-paper">{t("thisLot")}</span> : null}
      {folded ? (
        <button type="button" className="nodrag pointer-events-auto absolute inset-0 cursor-pointer" onClick={() => expand(node.kind)} title={t("expandGroup")}>{body}</button>
      ) : node.visible && node.code ? (
        <Link href={`/lots/${encodeURIComponent(node.code)}`} className="nodrag pointer-events-auto absolute inset-0 no-underline" aria-label={t("openLot", { code: node.code })}>{body}</Link>
      ) : (
        <span className="absolute inset-0" title={node.visible ? undefined : t("hiddenTitle")}>{body}</span>
      )}
      <Handle type="source" position={Position.Right} isConnectable={false} style={{ opacity: 0 }} />
    </div>
  );
}

const NODE_TYPES = Object.fromEntries(STAGE_ORDER.map((kind) => [kind, StageNode]));

/**
 * The office works at desks, so the server draws the desk's view; a phone switches after
 * hydration. (Drawing the phone's on the server made every desk draw the graph twice.)
 */
function useWideScreen(): boolean {
  const query = "(min-width: 768px)";
  return useSyncExternalStore(
    (notify) => { const m = window.matchMedia(query); m.addEventListener("change", notify); return () => m.removeEventListener("change", notify); },
    () => window.matchMedia(query).matches,
    () => true,
  );
}

/**
 * The canvas the server fits the first drawing into: a little smaller than a 1280 × 800 desk's
 * (70vh high), so the page shows the whole flow, fitted, before any script has run. The browser
 * fits it again to the real canvas once React Flow has measured it.
 */
const SERVER_CANVAS = { width: 1200, height: 520 };

type Props = {
  code: string;
  rootId: string;
  /** How many lots each stage holds, in stage order: the fold buttons. */
  counts: (readonly [StageKind, number])[];
  /** The first drawing, laid out on the server. */
  initial: GraphView;
  /** Every lot and link, when the first drawing already shows them all; otherwise asked for on the first fold or unfold. */
  graph?: LineageGraph;
};

/** The lineage of one lot as a pannable, zoomable drawing, stages foldable one by one. */
export function LineageGraphView({ code, rootId, counts, initial, graph }: Props) {
  const t = useTranslations("graph");
  const format = useFormatter();
  const amount = useQuantity();
  const wide = useWideScreen();
  const [view, setView] = useState(initial);
  const asked = useRef(0);
  // Marked once React Flow has started in the browser: until then the server's drawing shows, fitted,
  // but does not pan, zoom or unfold (the jobs bench times both moments).
  const canvas = useRef<HTMLDivElement>(null);
  // A large lineage's whole graph (137 KB for 474 lots) is not in the page: it held the first drawing back.
  const whole = useRef<Promise<LineageGraph> | null>(graph ? Promise.resolve(graph) : null);
  const wholeGraph = () =>
    (whole.current ??= fetch(`/api/lots/${encodeURIComponent(code)}/lineage`).then((r) => (r.ok ? (r.json() as Promise<LineageGraph>) : Promise.reject(new Error(`lineage ${r.status}`)))));
  const { placed } = view;
  const collapsed = new Set(view.folded);
  // The layout code (dagre) and, for a large lineage, every lot load only when someone folds or
  // unfolds; the first drawing came laid out. A failed request is asked again on the next click.
  const refold = (next: Set<StageKind>) => {
    const ask = ++asked.current;
    Promise.all([wholeGraph(), import("@/domain/lineage-placement")]).then(
      ([g, { placeView }]) => { if (ask === asked.current) setView(placeView(g, next)); },
      () => { if (!graph) whole.current = null; },
    );
  };
  const toggle = (kind: StageKind, fold?: boolean) => {
    const next = new Set(collapsed);
    if (fold ?? !collapsed.has(kind)) next.add(kind); else next.delete(kind);
    refold(next);
  };

  const nameOf = new Map(placed.nodes.map((n) => [n.id, `${t(`kinds.${n.kind}`)} ${n.id.startsWith("group:") ? t(`groups.${n.kind}`, { count: n.count }) : n.visible ? n.label : t("hiddenLot")}`]));
  const nodes: StageFlowNode[] = placed.nodes.map((n) => ({ id: n.id, type: n.kind, position: { x: n.x, y: n.y }, width: n.width, height: n.height, data: { node: n }, draggable: false, selectable: false, ariaLabel: nameOf.get(n.id) }));
  const hiddenIds = new Set(placed.nodes.filter((n) => !n.visible).map((n) => n.id));
  const foldedIds = new Set(placed.nodes.filter((n) => n.id.startsWith("group:")).map((n) => n.id));
  const edges: Edge[] = placed.edges.map((e) => {
    const field = e.source.startsWith("field-");
    const parts = [
      e.share !== null && !field ? format.number(e.share, { style: "percent", maximumFractionDigits: 1 }) : null,
      e.quantity !== null && e.unit ? amount(e.quantity, e.unit) : null,
    ].filter(Boolean);
    const muted = hiddenIds.has(e.source) || hiddenIds.has(e.target);
    return {
      id: e.id, source: e.source, target: e.target,
      label: (placed.overview && (foldedIds.has(e.source) || foldedIds.has(e.target))) || !parts.length ? undefined : parts.join(" · "),
      ariaLabel: `${nameOf.get(e.source)} → ${nameOf.get(e.target)}${parts.length ? `: ${parts.join(" · ")}` : ""}`,
      markerEnd: { type: MarkerType.ArrowClosed, color: muted ? "var(--color-husk)" : "var(--color-cedar)", width: 14, height: 14, markerUnits: "userSpaceOnUse" },
      style: { stroke: muted ? "var(--color-husk)" : "var(--color-cedar)", strokeWidth: 1.5 + 3 * Math.min(1, e.share ?? 0.3), strokeDasharray: muted ? "6 4" : undefined },
      labelStyle: { fill: "var(--color-ink)", fontSize: 11, fontWeight: 600 },
      labelBgStyle: { fill: "var(--color-paper)" }, labelBgPadding: [4, 2] as [number, number], labelBgBorderRadius: 4,
    };
  });

  // A phone shows the current lot and its neighbours at a readable size; a desk, the whole flow.
  const near = placed.edges.filter((e) => e.source === rootId || e.target === rootId).flatMap((e) => [e.source, e.target]);
  const focus = wide ? { padding: 0.05 } : { nodes: [rootId, ...near].map((id) => ({ id })), padding: 0.2, maxZoom: 1 };

  return (
    <div className="space-y-3">
      <div role="group" aria-label={t("foldLabel")} className="flex flex-wrap items-center gap-2 print:hidden">
        <span className="text-sm font-semibold text-ink-soft">{t("foldLabel")}</span>
        {counts.map(([kind, n]) => (
          <button key={kind} type="button" aria-pressed={collapsed.has(kind)} onClick={() => toggle(kind)}
            className={`rounded-full border-2 px-3 py-1 text-sm font-semibold ${collapsed.has(kind) ? "border-cedar-deep bg-cedar text-paper" : "border-husk bg-paper text-ink"}`}>
            {t(`kinds.${kind}`)} <span className="font-normal">({n})</span>
          </button>
        ))}
        {collapsed.size ? <button type="button" className="btn-quiet px-3 py-1 text-sm" onClick={() => refold(new Set())}>{t("expandAll")}</button> : null}
      </div>
      <div role="region" aria-label={t("canvasLabel", { code })} className="h-[70vh] min-h-96 overflow-hidden rounded-lg border-2 border-paper-deep bg-white/70 print:hidden" data-testid="lineage-canvas" ref={canvas}>
        <ExpandContext value={(kind) => toggle(kind, false)}>
          <ReactFlow key={`${wide}:${view.folded.join()}`} nodes={nodes} edges={edges} nodeTypes={NODE_TYPES} fitView fitViewOptions={focus} minZoom={0.1} maxZoom={2} {...SERVER_CANVAS}
            nodesDraggable={false} nodesConnectable={false} elementsSelectable={false} onInit={() => canvas.current?.setAttribute("data-interactive", "")}>
            <Background gap={24} color="var(--color-paper-deep)" />
            <Controls showInteractive={false} />
            {wide ? <MiniMap pannable zoomable nodeColor={(n) => (n.id === rootId ? "var(--color-persimmon)" : "var(--color-husk)")} /> : null}
          </ReactFlow>
        </ExpandContext>
      </div>
    </div>
  );
}
