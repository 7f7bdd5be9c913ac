import Link from "@/components/app-link";
import { Suspense } from "react";
import { notFound } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { LineageGraphView } from "@/components/lineage-graph";
import { readingOrder, stageCounts } from "@/domain/lineage-layout";
import { firstView } from "@/domain/lineage-placement";
import { normaliseLotCode } from "@/domain/lot-code";
import { GRAPH_MAX_NODES, lineageGraph } from "@/server/trace/lineage-graph";
import { findLotId } from "@/server/ledger/lots";
import { requirePageUser } from "@/server/accounts/page-guard";
import { LineageList } from "./lineage-list";
import { lineageListView } from "./list-view";
import { withClientMessages } from "@/i18n/client-messages";

type Search = { page?: string | string[]; list?: string | string[] };

export async function generateMetadata({ params }: { params: Promise<{ code: string }> }) {
  const t = await getTranslations("graph");
  return { title: t("metaTitle", { code: normaliseLotCode(decodeURIComponent((await params).code)) }) };
}

async function LotGraphPage({ params, searchParams }: { params: Promise<{ code: string }>; searchParams: Promise<Search> }) {
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
      {/* Its own boundary: React hydrates the list after the graph is drawn, not before. */}
      <Suspense>
        <LineageList items={readingOrder(graph)} view={lineageListView(code, await searchParams)} />
      </Suspense>
    </div>
  );
}

export default withClientMessages(["graph", "lot"], LotGraphPage);
