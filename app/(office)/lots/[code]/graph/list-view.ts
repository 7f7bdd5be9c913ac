/** The lineage page's list of lots (the graph's text alternative): which rows a page of it shows, and the address of each view. */

import { pageOf } from "@/lib/paging";

/**
 * Rows a page of the list shows, as every office table. The whole list of a 474-lot blend was
 * 350 KB of the page's React payload and held a first visit's drawing of the graph past 1 s
 * (bench/JOBS.md); "every lot on one page" still gives it to whoever asks (printing, searching).
 */
export const LINEAGE_LIST_PAGE_SIZE = 25;

/** A page number, or every lot at once: in the address, so links, reloads and printing keep it. */
export type LineageListView = { code: string; page: number; whole: boolean };

/** Reads the view from the page's search parameters (each may come twice, or be anything). */
export function lineageListView(code: string, search: { page?: string | string[]; list?: string | string[] }): LineageListView {
  const first = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v);
  return { code, page: Number(first(search.page)) || 1, whole: first(search.list) === "all" };
}

/** The address of a view, landing on the list rather than the top of the graph. */
export function lineageListHref({ code, page, whole }: LineageListView): string {
  const query = new URLSearchParams();
  if (whole) query.set("list", "all");
  else if (page > 1) query.set("page", String(page));
  const search = query.size ? `?${query}` : "";
  return `/lots/${encodeURIComponent(code)}/graph${search}#lineage-text`;
}

/** The rows the view shows, the page number kept within the list, and the 1-based range for "26–50 of 474". */
export function pageOfLineage<T>(items: T[], view: LineageListView) {
  return view.whole ? { rows: items, page: 1, pages: 1, from: items.length ? 1 : 0, to: items.length, total: items.length } : pageOf(items, view.page, LINEAGE_LIST_PAGE_SIZE);
}
