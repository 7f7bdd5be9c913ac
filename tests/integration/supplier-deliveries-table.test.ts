// The supplier account lists a grower's deliveries once, rendered on the server a page at a time
// (issue 15: supplier account ≤ 50 ms). These check that the pages, the "unpriced only" view and
// the CSV hold what the browser table they replace held: its filter, every row, and the CSV
// tanstack's table wrote from the same column accessors.
import { beforeAll, describe, expect, it } from "vitest";
import { getSqlite } from "@/server/platform/db";
import { deliveriesOf, type Delivery } from "@/server/suppliers/supplier-portal";
import { DELIVERIES_PAGE_SIZE, deliveriesCsvRows, deliveriesHref, isUnpriced, pageOfDeliveries } from "@/components/supplier-lists/deliveries-view";
import { oldDeliveryColumns, oldTableCsv } from "./old-table-csv";

const oldCsv = (rows: Delivery[]) => oldTableCsv(rows, oldDeliveryColumns);

/** Many deliveries: each seeded receipt of every grower, repeated to fill three pages, some reversed, some unpriced. */
function manyDeliveries(): Delivery[] {
  const growers = (getSqlite().prepare("select id from parties where kind = 'grower' order by id").all() as { id: string }[]).map((g) => g.id);
  const seeded = growers.flatMap((id) => deliveriesOf(id));
  expect(seeded.some((d) => d.amountYen === null)).toBe(true);
  expect(seeded.some((d) => d.amountYen !== null)).toBe(true);
  return Array.from({ length: 2 * DELIVERIES_PAGE_SIZE + 7 }, (_, i) => {
    const d = seeded[i % seeded.length]!;
    return { ...d, eventId: i + 1, reversed: i % 9 === 4 ? true : d.reversed, amountYen: i % 5 === 0 ? null : d.amountYen };
  });
}

describe("the supplier account's deliveries table", () => {
  let deliveries: Delivery[] = [];
  beforeAll(() => {
    deliveries = manyDeliveries();
  });

  it("shows every delivery, in the order read, a page at a time, the page number kept within the table", () => {
    const view = { partyId: "grower-ikeda", page: 1, unpricedOnly: false };
    const pages = [1, 2, 3].map((page) => pageOfDeliveries(deliveries, { ...view, page }));
    expect(pages.flatMap((p) => p.rows)).toEqual(deliveries);
    const size = DELIVERIES_PAGE_SIZE;
    expect(pages.map((p) => [p.from, p.to, p.pages, p.total])).toEqual([[1, size, 3, 2 * size + 7], [size + 1, 2 * size, 3, 2 * size + 7], [2 * size + 1, 2 * size + 7, 3, 2 * size + 7]]);
    expect(pageOfDeliveries(deliveries, { ...view, page: 99 }).page).toBe(3);
    for (const odd of [Number.NaN, -4, 0, 1.5]) expect(pageOfDeliveries(deliveries, { ...view, page: odd }).page).toBe(1);
    expect(pageOfDeliveries([], view)).toMatchObject({ rows: [], from: 0, to: 0, total: 0, pages: 1 });
  });

  it("shows alone the deliveries the old unpriced table listed: no price, not reversed", () => {
    const unpriced = pageOfDeliveries(deliveries, { partyId: "g", page: 1, unpricedOnly: true }).shown;
    expect(unpriced).toEqual(deliveries.filter((d) => d.amountYen === null && !d.reversed));
    expect(unpriced.length).toBeGreaterThan(0);
    expect(deliveries.filter(isUnpriced)).toEqual(unpriced);
  });

  it("writes the CSV the browser table wrote: every row of the view, not only the page shown", () => {
    const reference = oldCsv(deliveries);
    expect(deliveriesCsvRows(deliveries, "reversed")).toEqual(reference.rows);
    const unpriced = deliveries.filter(isUnpriced);
    expect(deliveriesCsvRows(pageOfDeliveries(deliveries, { partyId: "g", page: 2, unpricedOnly: true }).shown, "reversed")).toEqual(oldCsv(unpriced).rows);
  });

  it("keeps the view in the address", () => {
    expect(deliveriesHref({ partyId: "grower-ikeda", page: 2, unpricedOnly: true })).toBe("/suppliers/grower-ikeda?unpriced=1&page=2#deliveries");
    expect(deliveriesHref({ partyId: "grower-ikeda", page: 1, unpricedOnly: false })).toBe("/suppliers/grower-ikeda#deliveries");
  });
});
