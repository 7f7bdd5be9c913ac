// The supplier account lists a mill's polishing runs once, rendered on the server a page at a
// time (issue 15: supplier account ≤ 50 ms). These check that the pages, the "unpriced only"
// view and the CSV hold what the two browser tables they replace held: the unpriced table's
// filter, every row, and the CSV tanstack's table wrote from the same column accessors.
import { beforeAll, describe, expect, it } from "vitest";
import { getSqlite } from "@/server/platform/db";
import { runKeysOf, runsOf, runsWithIds, type Run } from "@/server/suppliers/supplier-portal";
import { ACCOUNT_LIST_PAGE_SIZE, accountListHref } from "@/components/supplier-lists/account-list-view";
import { isUnpricedRun, pageOfRuns, runsCsvRows } from "@/components/supplier-lists/runs-view";
import { oldRunColumns, oldTableCsv } from "./old-table-csv";

const oldCsv = (rows: Run[]) => oldTableCsv(rows, oldRunColumns);

/** Many runs: each seeded run of the mill, repeated to fill three pages, some reversed, some without a fee or a polished lot or ratio. */
function manyRuns(): Run[] {
  const mills = (getSqlite().prepare("select id from parties where kind = 'mill' order by id").all() as { id: string }[]).map((m) => m.id);
  const seeded = mills.flatMap((id) => runsOf(id));
  expect(seeded.some((r) => r.feeYen !== null)).toBe(true);
  expect(seeded.some((r) => r.reversed)).toBe(true);
  return Array.from({ length: 2 * ACCOUNT_LIST_PAGE_SIZE + 7 }, (_, i) => {
    const r = seeded[i % seeded.length]!;
    return {
      ...r,
      eventId: i + 1,
      reversed: i % 9 === 4 ? true : r.reversed,
      feeYen: i % 5 === 0 ? null : r.feeYen,
      polished: i % 11 === 3 ? null : r.polished,
      achievedPct: i % 7 === 2 ? null : r.achievedPct,
    };
  });
}

describe("the supplier account's polishing runs table", () => {
  let runs: Run[] = [];
  beforeAll(() => {
    runs = manyRuns();
  });

  it("shows every run, in the order read, a page at a time, the page number kept within the table", () => {
    const view = { partyId: "mill-shirotae", page: 1, unpricedOnly: false };
    const pages = [1, 2, 3].map((page) => pageOfRuns(runs, { ...view, page }));
    expect(pages.flatMap((p) => p.rows)).toEqual(runs);
    const size = ACCOUNT_LIST_PAGE_SIZE;
    expect(size).toBe(25);
    expect(pages.map((p) => [p.from, p.to, p.pages, p.total])).toEqual([[1, size, 3, 2 * size + 7], [size + 1, 2 * size, 3, 2 * size + 7], [2 * size + 1, 2 * size + 7, 3, 2 * size + 7]]);
    expect(pageOfRuns(runs, { ...view, page: 99 }).page).toBe(3);
    for (const odd of [Number.NaN, -4, 0, 1.5]) expect(pageOfRuns(runs, { ...view, page: odd }).page).toBe(1);
    expect(pageOfRuns([], view)).toMatchObject({ rows: [], from: 0, to: 0, total: 0, pages: 1 });
  });

  it("shows alone the runs the old unpriced table listed: no fee, not reversed", () => {
    const unpriced = pageOfRuns(runs, { partyId: "m", page: 1, unpricedOnly: true }).shown;
    expect(unpriced).toEqual(runs.filter((r) => r.feeYen === null && !r.reversed));
    expect(unpriced.length).toBeGreaterThan(0);
    expect(unpriced.length).toBeLessThan(runs.filter((r) => r.feeYen === null).length);
    expect(runs.filter(isUnpricedRun)).toEqual(unpriced);
  });

  it("writes the CSV the browser table wrote: every row of the view, not only the page shown", () => {
    expect(runsCsvRows(runs, "reversed")).toEqual(oldCsv(runs).rows);
    const unpriced = runs.filter(isUnpricedRun);
    expect(runsCsvRows(pageOfRuns(runs, { partyId: "m", page: 2, unpricedOnly: true }).shown, "reversed")).toEqual(oldCsv(unpriced).rows);
  });

  // A page places every run by its key (runKeysOf) and reads only its own runs in full.
  it("places each mill's runs by their keys as the full read orders them, and reads a page's runs in full alike", () => {
    const mills = (getSqlite().prepare("select id from parties where kind = 'mill' order by id").all() as { id: string }[]).map((m) => m.id);
    let seen = 0;
    for (const mill of mills) {
      const full = runsOf(mill);
      const keys = runKeysOf(mill);
      expect(keys).toEqual(full.map(({ eventId, feeYen, reversed }) => ({ eventId, feeYen, reversed })));
      for (const unpricedOnly of [false, true]) {
        const page = pageOfRuns(keys, { partyId: mill, page: 1, unpricedOnly });
        expect(runsWithIds(page.rows)).toEqual(pageOfRuns(full, { partyId: mill, page: 1, unpricedOnly }).rows);
      }
      seen += full.length;
    }
    expect(seen).toBeGreaterThan(0);
    expect(runsWithIds([])).toEqual([]);
    // A key that names no polishing run is never read as one (a receipt's event id, say).
    const receipt = getSqlite().prepare("select id from events where step = 'receiving' limit 1").get() as { id: number };
    expect(runsWithIds([{ eventId: receipt.id, feeYen: null, reversed: false }])).toEqual([]);
  });

  it("keeps the view in the address, in the same section as a grower's deliveries", () => {
    expect(accountListHref({ partyId: "mill-shirotae", page: 2, unpricedOnly: true })).toBe("/suppliers/mill-shirotae?unpriced=1&page=2#deliveries");
    expect(accountListHref({ partyId: "mill-shirotae", page: 1, unpricedOnly: false })).toBe("/suppliers/mill-shirotae#deliveries");
    // The mill's own account (/account) keeps the view in its own address.
    expect(accountListHref({ partyId: "mill-shirotae", page: 3, unpricedOnly: false, at: "/account" })).toBe("/account?page=3#deliveries");
  });
});
