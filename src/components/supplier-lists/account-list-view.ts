/**
 * The supplier account's one list of what a supplier did (a grower's deliveries, a mill's
 * polishing runs): the view the address holds, its address, and the page of it to show.
 */

import { pageOf } from "@/lib/paging";

/** Rows a page of the list shows (as the browser tables it replaced); its CSV carries every row of the view. */
export const ACCOUNT_LIST_PAGE_SIZE = 25;

/**
 * Which page, and whether only what no contract priced: both in the address, so links and
 * reloads keep them. `at`: the page's own address where it is not the office's account of the
 * party (a mill's own account, /account).
 */
export type AccountListView = { partyId: string; page: number; unpricedOnly: boolean; at?: string };

export function accountListHref({ partyId, page, unpricedOnly, at }: AccountListView): string {
  const query = new URLSearchParams();
  if (unpricedOnly) query.set("unpriced", "1");
  if (page > 1) query.set("page", String(page));
  const search = query.size ? `?${query}` : "";
  return `${at ?? `/suppliers/${encodeURIComponent(partyId)}`}${search}#deliveries`;
}

/** The rows the view holds, and the page of them to show, the page number kept within the list. */
export function pageOfAccountList<T>(all: T[], view: AccountListView, isUnpriced: (row: T) => boolean) {
  const shown = inView(all, view.unpricedOnly, isUnpriced);
  return { shown, ...pageOf(shown, view.page, ACCOUNT_LIST_PAGE_SIZE) };
}

/** The rows a view holds on every page: all of them, or only what no contract priced (the table and its CSV alike). */
export const inView = <T,>(all: T[], unpricedOnly: boolean, isUnpriced: (row: T) => boolean) => (unpricedOnly ? all.filter(isUnpriced) : all);

/** A list's column headers, read by a translator of the `suppliers` namespace (the table's and the CSV's). */
export const listHeaders = (columns: readonly string[], t: (key: string) => string) => columns.map((c) => t(`columns.${c}`));

/** The address of the list's CSV (`app/api/suppliers/[partyId]/list.csv`): the whole view, every page. */
export function listCsvHref(partyId: string, unpricedOnly: boolean): string {
  return `/api/suppliers/${encodeURIComponent(partyId)}/list.csv${unpricedOnly ? "?unpriced=1" : ""}`;
}
