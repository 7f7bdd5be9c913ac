import Link from "@/components/app-link";
import { getFormatter, getTranslations } from "next-intl/server";
import { getQuantity } from "@/lib/get-quantity";
import { PageLinks } from "@/components/page-links";
import { pageOfLots, recallHref, type ReachedLot, type TableView } from "./table-view";

/**
 * The lots a recall reached, a page at a time, rendered on the server only (no copy of the rows
 * for the browser); those shipped to a buyer stand out, and can be shown alone.
 */
export async function ReachedLotsTable({ lots, view }: { lots: ReachedLot[]; view: TableView }) {
  const t = await getTranslations();
  const format = await getFormatter();
  const amount = await getQuantity();
  const { rows, page, pages, from, to, total } = pageOfLots(lots, view);
  return (
    <div className="space-y-3">
      <p className="flex flex-wrap items-center gap-3 text-sm">
        <Link href={recallHref({ ...view, page: 1, onlyShipped: !view.onlyShipped })} className="btn-quiet" data-testid="recall-only-shipped" aria-pressed={view.onlyShipped}>
          {view.onlyShipped ? t("recall.showAllLots") : t("recall.onlyShipped")}
        </Link>
        <span data-testid="recall-lots-range">{t("recall.tableRange", { from, to, total })}</span>
      </p>
      <div className="overflow-x-auto rounded-lg border-2 border-paper-deep bg-white">
        <table className="w-full border-collapse text-sm" aria-label={t("recall.reachedTitle")} data-testid="recall-lots">
          <thead className="bg-paper-deep text-left">
            <tr>
              <th className="px-3 py-2">{t("recall.table.code")}</th>
              <th className="px-3 py-2">{t("recall.table.kind")}</th>
              <th className="px-3 py-2 text-right">{t("recall.table.fraction")}</th>
              <th className="px-3 py-2 text-right">{t("recall.table.onHand")}</th>
              <th className="px-3 py-2">{t("recall.table.holder")}</th>
              <th className="px-3 py-2">{t("holds.column")}</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((lot) => (
              <tr key={lot.code} className={`border-t border-paper-deep ${lot.shippedToBuyer ? "bg-persimmon-pale font-semibold" : ""}`} data-shipped={lot.shippedToBuyer || undefined}>
                <td className="px-3 py-2">
                  <Link href={`/lots/${encodeURIComponent(lot.code)}`} className="code-chip no-underline">{lot.code}</Link>
                  {lot.recalled ? <span className="ml-2 text-ink-soft">({t("recall.table.recalled")})</span> : null}
                  {lot.shippedToBuyer ? <span className="ml-2 text-persimmon">{t("recall.shippedToBuyer")}</span> : null}
                </td>
                <td className="px-3 py-2">{t(`lot.kinds.${lot.kind}`)}</td>
                <td className="px-3 py-2 text-right tabular-nums">{format.number(lot.fraction, { style: "percent", maximumFractionDigits: 1 })}</td>
                <td className="px-3 py-2 text-right tabular-nums">{amount(lot.onHand, lot.unit)}</td>
                <td className="px-3 py-2">{lot.holder}</td>
                <td className="px-3 py-2" data-testid="recall-hold">{lot.hold ? <span className="font-semibold text-persimmon">{t("holds.onHold", { reason: lot.hold })}</span> : <span className="text-ink-soft">{t("holds.notHeld")}</span>}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <PageLinks page={page} pages={pages} href={(p) => recallHref({ ...view, page: p })} label={t("recall.reachedTitle")} testId="recall-pages" words={{ previous: t("recall.previousPage"), next: t("recall.nextPage"), pageOf: t("recall.pageOf", { page, pages }) }} />
    </div>
  );
}
