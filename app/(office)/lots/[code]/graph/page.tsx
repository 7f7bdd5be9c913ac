import Link from "next/link";
import { notFound } from "next/navigation";
import { getFormatter, getTranslations } from "next-intl/server";
import { getQuantity } from "@/lib/get-quantity";
import { LineageGraphView } from "@/components/lineage-graph";
import { readingOrder, type LineageEdge, type LineageNode } from "@/domain/lineage-layout";
import { firstView } from "@/domain/lineage-placement";
import { normaliseLotCode } from "@/domain/lot-code";
import { lineageGraph } from "@/server/trace/lineage-graph";
import { findLotId } from "@/server/ledger/lots";
import { requirePageUser } from "@/server/accounts/page-guard";

// Room for a blend of about 500 lots, drawn whole with its stages grouped (bench/JOBS.md times it).
const MAX_NODES = 600;

export async function generateMetadata({ params }: { params: Promise<{ code: string }> }) {
  const t = await getTranslations("graph");
  return { title: t("metaTitle", { code: normaliseLotCode(decodeURIComponent((await params).code)) }) };
}

export default async function LotGraphPage({ params }: { params: Promise<{ code: string }> }) {
  const user = await requirePageUser();
  const code = normaliseLotCode(decodeURIComponent((await params).code));
  if (findLotId(user, code) === null) notFound();
  const graph = lineageGraph(user, code, { maxNodes: MAX_NODES });
  const t = await getTranslations("graph");

  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-baseline justify-between gap-3">
        <h1 className="text-3xl font-bold">{t("title", { code })}</h1>
        <Link href={`/lots/${encodeURIComponent(code)}`} className="btn-quiet print:hidden">{t("backToLot")}</Link>
      </div>
      <p className="max-w-3xl text-ink-soft">{t("intro")}</p>
      {graph.truncated ? <p className="notice-warn" role="status">{t("truncated", { max: MAX_NODES })}</p> : null}
      <LineageGraphView graph={graph} code={code} initial={firstView(graph)} />
      <LineageText items={readingOrder(graph)} />
    </div>
  );
}

/**
 * The same nodes and edges as an ordered list: for screen readers, printing and search.
 * Plain anchors, not <Link>: a 500-lot list of client links doubled the page's payload and
 * its hydration, and held the graph's first drawing back (bench/JOBS.md).
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
      <ol className="list-decimal space-y-3 pl-6">
        {items.map(({ node, current, from }) => (
          <li key={node.id} className={current ? "font-semibold" : undefined}>
            <span className="mr-2">{t(`kinds.${node.kind}`)}</span>
            {node.visible && node.code ? <a href={`/lots/${encodeURIComponent(node.code)}`} className="code-chip no-underline">{node.code}</a> : <span>{name(node)}</span>}
            {node.code && node.label !== node.code ? <span className="ml-2">{node.label}</span> : null}
            {[node.detail, amount(node.quantity, node.unit)].filter(Boolean).map((x) => <span key={x} className="ml-2 text-sm text-ink-soft">{x}</span>)}
            {current ? <span className="ml-2 text-sm text-persimmon">{t("thisLot")}</span> : null}
            {from.length ? (
              <div className="mt-1 text-sm font-normal">
                <span className="text-ink-soft">{t("madeFrom")}</span>
                <ul className="ml-4 list-disc pl-4">
                  {from.map(({ edge, source }) => <li key={source.id}>{t("fromLine", { source: `${t(`kinds.${source.kind}`)} ${source.visible ? (source.code ?? source.label ?? "") : t("hiddenLot")}`, amounts: via(edge) })}</li>)}
                </ul>
              </div>
            ) : null}
          </li>
        ))}
      </ol>
    </section>
  );
}
