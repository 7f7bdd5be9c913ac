import Link from "@/components/app-link";
import { getFormatter, getTranslations } from "next-intl/server";
import { getQuantity } from "@/lib/get-quantity";
import { PageLinks } from "@/components/page-links";
import type { LineageEdge, LineageNode, ReadingItem } from "@/domain/lineage-layout";
import { LINEAGE_LIST_PAGE_SIZE, lineageListHref, pageOfLineage, type LineageListView } from "./list-view";

/**
 * The same nodes and edges as an ordered list, a page at a time: for screen readers, printing
 * and search. Rendered on the server only. Plain anchors, not <Link>: a list of client links
 * doubled the page's payload and its hydration (bench/JOBS.md). For the same reason each row is
 * few elements, spaced by text and styled from the list, not element by element.
 */
export async function LineageList({ items, view }: { items: ReadingItem[]; view: LineageListView }) {
  const t = await getTranslations("graph");
  const tt = await getTranslations("table");
  const format = await getFormatter();
  const quantity = await getQuantity();
  const { rows, page, pages, from, to, total } = pageOfLineage(items, view);
  const amount = (q: number | null, unit: string | null) => (q !== null && unit ? quantity(q, unit) : null);
  const name = (n: LineageNode) => (n.visible ? (n.label ?? n.code ?? "") : t("hiddenLot"));
  const via = (e: LineageEdge) => [e.share !== null ? format.number(e.share, { style: "percent", maximumFractionDigits: 1 }) : null, amount(e.quantity, e.unit)].filter(Boolean).join(" · ");
  return (
    <section className="panel scroll-mt-4" id="lineage-text" data-testid="lineage-text" data-total={total}>
      <h2 className="text-xl font-bold">{t("listTitle")}</h2>
      <p className="mb-4 text-sm text-ink-soft">{t("listIntro")}</p>
      <p className="mb-3 flex flex-wrap items-center gap-3 text-sm print:hidden">
        <span data-testid="lineage-range">{t("listRange", { from, to, total })}</span>
        {total > LINEAGE_LIST_PAGE_SIZE ? (
          <Link href={lineageListHref({ ...view, page: 1, whole: !view.whole })} className="btn-quiet" data-testid="lineage-whole">
            {view.whole ? t("listPaged", { size: LINEAGE_LIST_PAGE_SIZE }) : t("listWhole")}
          </Link>
        ) : null}
      </p>
      {/* start: the numbers run on from page to page, so "lot 31" is the same lot on any page. */}
      <ol start={from || 1} className="list-decimal space-y-3 pl-8 [&_small]:text-sm [&_small]:text-ink-soft [&_ul]:ml-4 [&_ul]:list-disc [&_ul]:pl-4">
        {rows.map(({ node, current, from: sources }) => {
          const about = [node.detail, amount(node.quantity, node.unit)].filter(Boolean).join(" · ");
          return (
            <li key={node.id} className={current ? "font-semibold" : undefined}>
              {t(`kinds.${node.kind}`)}{" "}
              {node.visible && node.code ? <a href={`/lots/${encodeURIComponent(node.code)}`} className="code-chip no-underline">{node.code}</a> : name(node)}
              {node.code && node.label !== node.code ? ` ${node.label}` : null}
              {about ? <> <small>{about}</small></> : null}
              {current ? <> <small className="text-persimmon!">{t("thisLot")}</small></> : null}
              {sources.length ? (
                <div className="mt-1 text-sm font-normal">
                  <small>{t("madeFrom")}</small>
                  <ul>{sources.map(({ edge, source }) => <li key={source.id}>{t("fromLine", { source: `${t(`kinds.${source.kind}`)} ${source.visible ? (source.code ?? source.label ?? "") : t("hiddenLot")}`, amounts: via(edge) })}</li>)}</ul>
                </div>
              ) : null}
            </li>
          );
        })}
      </ol>
      <div className="mt-4 print:hidden">
        <PageLinks page={page} pages={pages} href={(p) => lineageListHref({ ...view, page: p })} label={t("listPages")} testId="lineage-pages" words={{ previous: tt("previous"), next: tt("next"), pageOf: tt("page", { page, pages }) }} />
      </div>
    </section>
  );
}
