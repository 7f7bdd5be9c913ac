/** The supplier account's table of a grower's deliveries: what a page of it shows, and its CSV. */

import type { Delivery } from "@/server/suppliers/supplier-portal";
import { ACCOUNT_LIST_PAGE_SIZE, accountListHref, pageOfAccountList, type AccountListView } from "@/components/supplier-lists/account-list-view";

export const DELIVERIES_PAGE_SIZE = ACCOUNT_LIST_PAGE_SIZE;
export type DeliveriesView = AccountListView;
export const deliveriesHref = accountListHref;

/** A delivery received while no contract priced it (a reversed receipt owes nothing either way). */
export const isUnpriced = (d: Delivery) => d.amountYen === null && !d.reversed;

export const pageOfDeliveries = (deliveries: Delivery[], view: DeliveriesView) => pageOfAccountList(deliveries, view, isUnpriced);

/** The table's columns, in order, as keys of the catalogue's `suppliers.columns`: its CSV cells below follow them. */
export const DELIVERY_COLUMNS = ["date", "lot", "variety", "cropYear", "grade", "kg", "slip", "receiver", "amount", "status"] as const;

/**
 * The CSV's cells, as the office table's CSV wrote them: each column's plain value (the grade's
 * key, the amount in yen or empty), dates as ISO 8601.
 */
export function deliveriesCsvRows(deliveries: Delivery[], reversedLabel: string): unknown[][] {
  return deliveries.map((d) => [d.at.toISOString(), d.code, d.variety ?? "", d.cropYear ?? "", d.grade ?? "", d.kg, d.slip ?? "", d.receiver ?? "", d.amountYen ?? "", d.reversed ? reversedLabel : ""]);
}
