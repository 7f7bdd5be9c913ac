import Link from "next/link";
import { Suspense } from "react";
import { notFound } from "next/navigation";
import { getFormatter, getTranslations } from "next-intl/server";
import { getQuantity } from "@/lib/get-quantity";
import { LineageGraphView } from "@/components/lineage-graph";
import { readingOrder, stageCounts, type LineageEdge, type LineageNode } from "@/domain/lineage-layout";
import { firstView } from "@/domain/lineage-placement";
import { normaliseLotCode } from "@/domain/lot-code";
import { GRAPH_MAX_NODES, lineageGraph } from "@/server/trace/lineage-graph";
import { findLotId } from "@/server/ledger/lots";
import { requirePageUser } from "@/server/accounts/page-guard";

export async function generateMetadata({ params }: { params: Promise<{ code: string }> }) {
  const t = await getTranslations("graph");
  return { title: t("metaTitle", { code: normaliseLotCode(decodeURIComponent((await params).code)) }) };
}

export default async function LotGraphPage({ params }: { params: Promise<{ code: string }> }) {
  const user = await requirePageUser();
  const code = normaliseLotCode(decodeURIComponent((await params).code));
  if (findLotId(user, code) === null) notFound();
  const graph = lineageGraph(user, code, { maxNodes: GRAPH_MAX_NODES });
  const initial = firstView(graph);
  const t = await getTranslations("graph");

  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-baseline justify-between gap-3">
        <h1 className="text-3xl font-bold">{t("title", { code })}</h1>
        <Link href={`/lots/${encodeURIComponent(code)}`} className="btn-quiet print:hidden">{t("backToLot")}</Link>
      </div>
      <p className="max-w-3xl text-ink-soft">{t("intro")}</p>
      {graph.truncated ? <p className="notice-warn" role="status">{t("truncated", { max: GRAPH_MAX_NODES })}</p> : null}
      {/* A folded first view leaves the whole graph out of the page: the browser asks for it on unfolding. */}
      <LineageGraphView code={code} rootId={graph.rootId} counts={stageCounts(graph.nodes)} initial={initial} graph={initial.folded.length ? undefined : graph} />
      {/* Its own boundary: React hydrates the 500-row list after the graph is drawn, not before. */}
      <Suspense>
        <LineageText items={readingOrder(graph)} />
      </Suspense>
    </div>
  );
}

/**
 * The same nodes and edges as an ordered list: for screen readers, printing and search.
 * Plain anchors, not <Link>: a 500-lot list of client links doubled the page's payload and
 * its hydration, and held the graph's first drawing back (bench/JOBS.md). For the same reason
 * each row is few elements, spaced by text and styled from the list, not element by element.
 */
async function LineageText({ items }: { items: ReturnType<typeof readingOrder> }) {
  const t = await getTranslations("graph");
  const format = await getFormatter();
  const quantity = await getQuantity();
  const amount = (q: number | null, unit: string | null) => (q !== null && unit ? quantity(q, unit) : null);
  const name = (n: LineageNode) => (n.visible ? (n.label ?? n.code ?? "") : t("hiddenLot"));
  const via = (e: LineageEdge) => [e.share !== null ? format.number(e.share, { style: "percent", maximumFractionDigits: 1 }) : null, amount(e.quantity, e.unit)].filter(Boolean).join(" · ");
  return (
    <section className="panel" data-testid="lineage-text">
      <h2 className="text-xl font-bold">{t("listTitle")}</h2>
      <p className="mb-4 text-sm text-ink-soft">{t("listIntro")}</p>
      <ol className="list-decimal space-y-3 pl-6 [&_small]:text-sm [&_small]:text-ink-soft [&_ul]:ml-4 [&_ul]:list-disc [&_ul]:pl-4">
        {items.map(({ node, current, from }) => {
          const about = [node.detail, amount(node.quantity, node.unit)].filter(Boolean).join(" · ");
          return (
            <li key={node.id} className={current ? "font-semibold" : undefined}>
              {t(`kinds.${node.kind}`)}{" "}
              {node.visible && node.code ? <a href={`/lots/${encodeURIComponent(node.code)}`} className="code-chip no-underline">{node.code}</a> : name(node)}
              {node.code && node.label !== node.code ? ` ${node.label}` : null}
              {about ? <> <small>{about}</small></> : null}
              {current ? <> <small className="text-persimmon!">{t("thisLot")}</small></> : null}
              {from.length ? (
                <div className="mt-1 text-sm font-normal">
                  <small>{t("madeFrom")}</small>
                  <ul>{from.map(({ edge, source }) => <li key={source.id}>{t("fromLine", { source: `${t(`kinds.${source.kind}`)} ${source.visible ? (source.code ?? source.label ?? "") : t("hiddenLot")}`, amounts: via(edge) })}</li>)}</ul>
                </div>
              ) : null}
            </li>
          );
        })}
      </ol>
    </section>
  );
}
