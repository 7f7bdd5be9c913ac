// The lineage page's list (the graph's text alternative) is rendered a page at a time (issue 15:
// the graph's first load ≤ 1 s). These check that its pages, read in turn, hold exactly the list
// the page used to show whole, in the same order, and that "every lot on one page" is that list.
import { describe, expect, it } from "vitest";
import { readingOrder } from "@/domain/lineage-layout";
import { lineageGraph } from "@/server/trace/lineage-graph";
import { DEMO_USERS } from "@/server/records/seed";
import type { SessionUser } from "@/server/accounts/session";
import { LINEAGE_LIST_PAGE_SIZE, lineageListHref, lineageListView, pageOfLineage } from "../../app/(office)/lots/[code]/graph/list-view";

// BL25-0001, the seeded blend: 31 lots from two paddies to one bottling (src/server/records/seed-brewing.ts).
const CODE = "BL25-0001";
const admin = DEMO_USERS.find((u) => u.email === "admin@example.com")! as SessionUser;

describe("the lineage list, a page at a time", () => {
  const whole = () => readingOrder(lineageGraph(admin, CODE));

  it("holds every lot of the whole list once, in its order, across its pages", () => {
    const items = whole();
    expect(items).toHaveLength(31);
    const first = pageOfLineage(items, lineageListView(CODE, {}));
    expect(first).toMatchObject({ page: 1, pages: 2, from: 1, to: 25, total: 31 });
    const read = [];
    for (let page = 1; page <= first.pages; page++) read.push(...pageOfLineage(items, lineageListView(CODE, { page: String(page) })).rows);
    expect(read.map((i) => i.node.id)).toEqual(items.map((i) => i.node.id));
    expect(pageOfLineage(items, lineageListView(CODE, { page: "2" }))).toMatchObject({ from: 26, to: 31, total: 31 });
  });

  it("shows every lot on one page when asked, and keeps an odd page number within the list", () => {
    const items = whole();
    const all = pageOfLineage(items, lineageListView(CODE, { list: "all", page: "2" }));
    expect(all.rows).toEqual(items);
    expect(all).toMatchObject({ page: 1, pages: 1, from: 1, to: 31 });
    expect(pageOfLineage(items, lineageListView(CODE, { page: "99" })).page).toBe(2);
    expect(pageOfLineage(items, lineageListView(CODE, { page: ["x", "2"] })).page).toBe(1);
    expect(pageOfLineage([], lineageListView(CODE, {}))).toMatchObject({ rows: [], from: 0, to: 0, total: 0 });
    expect(LINEAGE_LIST_PAGE_SIZE).toBe(25);
  });

  it("links each view to the list on the lineage page, keeping the code's escapes", () => {
    expect(lineageListHref({ code: CODE, page: 1, whole: false })).toBe(`/lots/${CODE}/graph#lineage-text`);
    expect(lineageListHref({ code: CODE, page: 3, whole: false })).toBe(`/lots/${CODE}/graph?page=3#lineage-text`);
    expect(lineageListHref({ code: CODE, page: 3, whole: true })).toBe(`/lots/${CODE}/graph?list=all#lineage-text`);
    expect(lineageListHref({ code: "A/B 1", page: 2, whole: false })).toBe("/lots/A%2FB%201/graph?page=2#lineage-text");
  });
});
