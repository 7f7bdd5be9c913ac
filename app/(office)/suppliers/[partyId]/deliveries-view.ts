/** The supplier account's table of a grower's deliveries: what a page of it shows, the address of each view, and its CSV. */

import { pageOf } from "@/lib/paging";
import type { Delivery } from "@/server/suppliers/supplier-portal";

/** Rows a page of the table shows (as the browser table it replaced); the CSV carries every delivery of the view. */
export const DELIVERIES_PAGE_SIZE = 25;

/** Which page, and whether only the deliveries without a contract price: both in the address, so links and reloads keep them. */
export type DeliveriesView = { partyId: string; page: number; unpricedOnly: boolean };

export function deliveriesHref({ partyId, page, unpricedOnly }: DeliveriesView): string {
  const query = new URLSearchParams();
  if (unpricedOnly) query.set("unpriced", "1");
  if (page > 1) query.set("page", String(page));
  const search = query.size ? `?${query}` : "";
  return `/suppliers/${encodeURIComponent(partyId)}${search}#deliveries`;
}

/** A delivery received while no contract priced it (a reversed receipt owes nothing either way). */
export const isUnpriced = (d: Delivery) => d.amountYen === null && !d.reversed;

/** The deliveries the view holds, and the page of them to show, the page number kept within the table. */
export function pageOfDeliveries(deliveries: Delivery[], view: DeliveriesView) {
  const shown = view.unpricedOnly ? deliveries.filter(isUnpriced) : deliveries;
  return { shown, ...pageOf(shown, view.page, DELIVERIES_PAGE_SIZE) };
}

/**
 * The CSV's cells, as the office table's CSV wrote them: each column's plain value (the grade's
 * key, the amount in yen or empty), dates as ISO 8601.
 */
export function deliveriesCsvRows(deliveries: Delivery[], reversedLabel: string): unknown[][] {
  return deliveries.map((d) => [d.at.toISOString(), d.code, d.variety ?? "", d.cropYear ?? "", d.grade ?? "", d.kg, d.slip ?? "", d.receiver ?? "", d.amountYen ?? "", d.reversed ? reversedLabel : ""]);
}
