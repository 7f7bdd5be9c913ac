/** The recall page's table of reached lots: what a page of it shows, and the address of each view. */

import { pageOf } from "@/lib/paging";

export type ReachedLot = { code: string; kind: string; unit: string; fraction: number; onHand: number; holder: string; recalled: boolean; shippedToBuyer: boolean; hold: string | null };

/** Rows of the lots table a page shows (25, as every office table): a wide recall reaches thousands; the CSV carries them all. */
export const RECALL_PAGE_SIZE = 25;

/** Which page of the table, and whether only lots shipped to buyers: both in the address, so links and reloads keep them. */
export type TableView = { code: string; page: number; onlyShipped: boolean };

export function recallHref({ code, page, onlyShipped }: TableView): string {
  const query = new URLSearchParams({ code });
  if (onlyShipped) query.set("shipped", "1");
  if (page > 1) query.set("page", String(page));
  return `/recall?${query}`;
}

/** The page of lots to show, the page number kept within the table. */
export function pageOfLots(lots: ReachedLot[], view: TableView) {
  return pageOf(view.onlyShipped ? lots.filter((l) => l.shippedToBuyer) : lots, view.page, RECALL_PAGE_SIZE);
}

/** How many lots of each kind the recall reached (the recalled lot left out), in the order first met. */
export function countByKind(lots: ReachedLot[]): [string, number][] {
  const counts = new Map<string, number>();
  for (const l of lots) if (!l.recalled) counts.set(l.kind, (counts.get(l.kind) ?? 0) + 1);
  return [...counts];
}
