import Link from "@/components/app-link";
import { getFormatter, getTranslations } from "next-intl/server";
import type { Delivery } from "@/server/suppliers/supplier-portal";
import { AccountListTable } from "./account-list-table";
import { listHeaders } from "./account-list-view";
import { DELIVERY_COLUMNS, pageOfDeliveries, type DeliveriesView } from "./deliveries-view";

/** A grower's deliveries and what each was priced at, a page at a time; "no contract price" where none was. */
export async function DeliveriesPagedTable({ deliveries, view }: { deliveries: Delivery[]; view: DeliveriesView }) {
  const t = await getTranslations("suppliers");
  const tl = await getTranslations("lot");
  const format = await getFormatter();
  const yen = (v: number) => format.number(v, { style: "currency", currency: "JPY" });
  const { shown: _all, rows, ...paging } = pageOfDeliveries(deliveries, view);
  const headers = listHeaders(DELIVERY_COLUMNS, t);
  const words = { unpricedOnly: t("detail.showUnpriced"), all: t("detail.showAllDeliveries"), range: t("detail.deliveriesRange", paging) };
  return (
    <AccountListTable view={view} name="deliveries" label={t("detail.deliveries")} headers={headers} paging={paging} words={words} rows={rows.map((d) => (
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
    ))} />
  );
}
