import Link from "@/components/app-link";
import type { ReactNode } from "react";
import { getTranslations } from "next-intl/server";
import { CsvDownloadLinks } from "@/components/csv-download-links";
import { PageLinks } from "@/components/page-links";
import { accountListHref, listCsvHref, type AccountListView } from "./account-list-view";

type Props = {
  view: AccountListView;
  /** "deliveries" or "runs": names the table's test ids and its CSV file (grainline-deliveries.csv). */
  name: string;
  label: string;
  headers: string[];
  paging: { page: number; pages: number; from: number; to: number; total: number };
  words: { unpricedOnly: string; all: string; range: string };
  /** The page's rows; none draws the table's empty line. */
  rows: ReactNode[];
};

/**
 * The frame of the supplier account's one list, rendered on the server only (the rows are not
 * sent again for the browser to draw): the "unpriced only" switch and range above, the CSV of
 * the whole view (written by the server when asked, not sent with the page), the table's head, and the page links below.
 */
export async function AccountListTable({ view, name, label, headers, paging, words, rows }: Props) {
  const tt = await getTranslations("table");
  const tc = await getTranslations("csv");
  const { page, pages } = paging;
  return (
    <div className="space-y-3" data-testid={`${name}-table`}>
      <div className="flex flex-wrap items-center justify-between gap-3 text-sm">
        <p className="flex flex-wrap items-center gap-3">
          <Link href={accountListHref({ ...view, page: 1, unpricedOnly: !view.unpricedOnly })} className="btn-quiet" data-testid={`${name}-unpriced-only`} aria-pressed={view.unpricedOnly}>
            {view.unpricedOnly ? words.all : words.unpricedOnly}
          </Link>
          <span data-testid={`${name}-range`}>{words.range}</span>
        </p>
        <div className="flex items-center gap-3">
          <CsvDownloadLinks href={listCsvHref(view.partyId, view.unpricedOnly)} label={tc("download")} className="btn-quiet" testId={`${name}-table-csv`} />
        </div>
      </div>
      <div className="overflow-x-auto rounded-lg border-2 border-paper-deep bg-white">
        {/* The rows' and cells' look is set once here, not on each: every row is written twice, in the HTML and in the page's payload. */}
        <table className="w-full border-collapse text-sm [&_td]:px-3 [&_td]:py-2 [&_tbody_tr]:border-t [&_tbody_tr]:border-paper-deep [&_tbody_tr:nth-child(odd)]:bg-paper/40" aria-label={label}>
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
              rows
            )}
          </tbody>
        </table>
      </div>
      <PageLinks page={page} pages={pages} href={(p) => accountListHref({ ...view, page: p })} label={label} testId={`${name}-pages`} words={{ previous: tt("previous"), next: tt("next"), pageOf: tt("page", { page, pages }) }} />
    </div>
  );
}
