import Link from "@/components/app-link";
import { getFormatter, getTranslations } from "next-intl/server";
import { runsWithIds, type RunKey } from "@/server/suppliers/supplier-portal";
import { AccountListTable } from "./account-list-table";
import { listHeaders, type AccountListView } from "./account-list-view";
import { pageOfRuns, RUN_COLUMNS } from "./runs-view";

/**
 * A mill's polishing runs and the fee each earned, a page at a time; "no contract fee" where none
 * was. `runs` places them (`runKeysOf`); only the page's own runs are read in full.
 */
export async function RunsPagedTable({ runs, view }: { runs: RunKey[]; view: AccountListView }) {
  const t = await getTranslations("suppliers");
  const format = await getFormatter();
  const yen = (v: number) => format.number(v, { style: "currency", currency: "JPY" });
  const pct = (v: number | null) => (v === null ? "" : `${format.number(v, { maximumFractionDigits: 1 })} %`);
  const { shown: _all, rows: keys, ...paging } = pageOfRuns(runs, view);
  const rows = runsWithIds(keys);
  const headers = listHeaders(RUN_COLUMNS, t);
  const words = { unpricedOnly: t("detail.showUnpricedRuns"), all: t("detail.showAllRuns"), range: t("detail.runsRange", paging) };
  return (
    <AccountListTable view={view} name="runs" label={t("detail.runs")} headers={headers} paging={paging} words={words} rows={rows.map((r) => (
      <tr key={r.eventId} data-unpriced={r.feeYen === null || undefined}>
        <td>{format.dateTime(r.at, "day")}</td>
        <td>{r.polished ? <Link className="code-chip no-underline" href={`/lots/${r.polished}`}>{r.polished}</Link> : ""}</td>
        <td>{format.number(r.brownKg ?? 0, { maximumFractionDigits: 1 })}</td>
        <td>{pct(r.targetPct)}</td>
        <td>{pct(r.achievedPct)}</td>
        <td>{r.feeYen === null ? <span className="text-persimmon">{t("noFee")}</span> : yen(r.feeYen)}</td>
        <td>{r.reversed ? t("reversed") : ""}</td>
      </tr>
    ))} />
  );
}
