import Link from "next/link";
import { getFormatter, getTranslations } from "next-intl/server";
import { RowsCsvButtons } from "@/components/csv-buttons";
import { PageLinks } from "@/components/page-links";
import type { Delivery } from "@/server/suppliers/supplier-portal";
import { deliveriesCsvRows, deliveriesHref, pageOfDeliveries, type DeliveriesView } from "./deliveries-view";

/**
 * A grower's deliveries and what each was priced at, a page at a time, rendered on the server
 * only (the rows are not sent again for the browser to draw); "no contract price" where none was.
 */
export async function DeliveriesPagedTable({ deliveries, view }: { deliveries: Delivery[]; view: DeliveriesView }) {
  const t = await getTranslations("suppliers");
  const tl = await getTranslations("lot");
  const tt = await getTranslations("table");
  const format = await getFormatter();
  const yen = (v: number) => format.number(v, { style: "currency", currency: "JPY" });
  const { shown, rows, page, pages, from, to, total } = pageOfDeliveries(deliveries, view);
  const headers = [t("columns.date"), t("columns.lot"), t("columns.variety"), t("columns.cropYear"), t("columns.grade"), t("columns.kg"), t("columns.slip"), t("columns.receiver"), t("columns.amount"), t("columns.status")];
  return (
    <div className="space-y-3" data-testid="deliveries-table">
      <div className="flex flex-wrap items-center justify-between gap-3 text-sm">
        <p className="flex flex-wrap items-center gap-3">
          <Link href={deliveriesHref({ ...view, page: 1, unpricedOnly: !view.unpricedOnly })} className="btn-quiet" data-testid="deliveries-unpriced-only" aria-pressed={view.unpricedOnly}>
            {view.unpricedOnly ? t("detail.showAllDeliveries") : t("detail.showUnpriced")}
          </Link>
          <span data-testid="deliveries-range">{t("detail.deliveriesRange", { from, to, total })}</span>
        </p>
        <div className="flex items-center gap-3">
          <RowsCsvButtons headers={headers} rows={deliveriesCsvRows(shown, t("reversed"))} exportName="grainline-deliveries" testId="deliveries-table" />
        </div>
      </div>
      <div className="overflow-x-auto rounded-lg border-2 border-paper-deep bg-white">
        {/* The rows' and cells' look is set once here, not on each: every row is written twice, in the HTML and in the page's payload. */}
        <table className="w-full border-collapse text-sm [&_td]:px-3 [&_td]:py-2 [&_tbody_tr]:border-t [&_tbody_tr]:border-paper-deep [&_tbody_tr:nth-child(odd)]:bg-paper/40" aria-label={t("detail.deliveries")}>
          <thead className="bg-paper-deep text-left">
            <tr>
              {headers.map((h) => (
                <th key={h} scope="col" className="px-3 py-2 font-semibold">{h}</th>
              ))}
            </tr>
          </thead>
          <tbody>
            {rows.length === 0 ? (
              <tr>
                <td colSpan={headers.length} className="py-6! text-center text-ink-soft">{tt("empty")}</td>
              </tr>
            ) : (
              rows.map((d) => (
                <tr key={`${d.eventId}-${d.code}`} data-unpriced={d.amountYen === null || undefined}>
                  <td>{format.dateTime(d.at, "day")}</td>
                  <td><Link className="code-chip no-underline" href={`/lots/${d.code}`}>{d.code}</Link></td>
                  <td>{d.variety}</td>
                  <td>{d.cropYear}</td>
                  <td>{d.grade ? tl(`grades.${d.grade}`) : ""}</td>
                  <td>{format.number(d.kg, { maximumFractionDigits: 1 })}</td>
                  <td>{d.slip}</td>
                  <td>{d.receiver}</td>
                  <td>{d.amountYen === null ? <span className="text-persimmon">{t("noPrice")}</span> : yen(d.amountYen)}</td>
                  <td>{d.reversed ? t("reversed") : ""}</td>
                </tr>
              ))
            )}
          </tbody>
        </table>
      </div>
      <PageLinks page={page} pages={pages} href={(p) => deliveriesHref({ ...view, page: p })} label={t("detail.deliveries")} testId="deliveries-pages" words={{ previous: tt("previous"), next: tt("next"), pageOf: tt("page", { page, pages }) }} />
    </div>
  );
}
