// The recall reads thousands of lots and events at once (issue 15: recall of a harvest lot to CSV
// ≤ 200 ms). This checks its answer against a plain reference, lot by lot and event by event: the
// path-by-path recursive walk down the lineage for the reached lots and their shares, and one
// query per lot and per event for what touched them, corrections included.
import { beforeAll, describe, expect, it, vi } from "vitest";
import type { FormState } from "@/lib/form-state";
import { getSqlite } from "@/server/platform/db";
import { loadRecall, recallRows, shipmentsToBuyers } from "@/server/trace/recall";
import { recallLines } from "@/server/trace/recall-lines";
import { pageOfLots, RECALL_PAGE_SIZE, recallHref, type ReachedLot } from "../../app/(office)/recall/table-view";
import { correctEventAction, shipToBuyerAction } from "../../app/(office)/lots/[code]/actions";
import { submit } from "../support/action-scope";
import { signInAs } from "../support/api";

vi.mock("next/headers", async () => (await import("../support/action-scope")).nextHeaders);
vi.mock("next/cache", async () => (await import("../support/action-scope")).nextCache);
vi.mock("next-intl/server", async () => (await import("../support/action-scope")).nextIntlServer());

const db = () => getSqlite();
const one = (sql: string, ...args: unknown[]) => db().prepare(sql).get(...args) as Record<string, unknown>;
const all = <T>(sql: string, ...args: unknown[]) => db().prepare(sql).all(...args) as T[];
const state = (answer: Awaited<ReturnType<typeof submit>>): FormState => ("state" in answer ? answer.state : { message: `redirect to ${answer.redirect}` });

/** Every lot below `lotId` with its share, summed over every path (tests/integration/trace.test.ts walks up the same way). */
function walkDown(lotId: number): Map<string, number> {
  const rows = all<{ code: string; share: number }>(
    `with recursive down(lot_id, frac) as (
       select ?, 1.0
       union all
       select e.child_lot_id, down.frac * e.weight / c.content_in
       from down join lineage_edges e on e.parent_lot_id = down.lot_id join lots c on c.id = e.child_lot_id
       where c.content_in > 0)
     select l.code, sum(frac) as share from down join lots l on l.id = down.lot_id
     where down.lot_id <> ? group by l.id having abs(sum(frac)) > 1e-9 order by l.id`,
    lotId,
    lotId,
  );
  return new Map(rows.map((r) => [r.code, r.share]));
}

type Line = { lot: string; quantity: number; use?: string };
/** The events touching these lots and their corrections, read one lot and one event at a time. */
function eventsOf(lotIds: number[]) {
  const ids = new Set<number>();
  for (const id of lotIds) {
    for (const r of all<{ e: number }>("select event_id as e from event_inputs where lot_id = ? union select event_id from event_outputs where lot_id = ?", id, id)) ids.add(r.e);
  }
  for (const id of [...ids]) {
    const correction = one("select id from events where corrects = ?", id) as { id: number } | undefined;
    if (correction) ids.add(correction.id);
  }
  return [...ids]
    .map((id) => {
      const e = one("select e.id, e.at, e.step, e.corrects, e.reference_doc as referenceDoc, p.name as party, u.name as user, c.name as counterparty from events e join parties p on p.id = e.party_id join users u on u.id = e.user_id left join parties c on c.id = e.counterparty_id where e.id = ?", id);
      const correctedBy = (one("select id from events where corrects = ?", id) as { id: number } | undefined)?.id ?? null;
      const inputs = all<Line>("select l.code as lot, i.quantity, i.use from event_inputs i join lots l on l.id = i.lot_id where i.event_id = ? order by i.id", id);
      const outputs = all<Line>("select l.code as lot, o.quantity from event_outputs o join lots l on l.id = o.lot_id where o.event_id = ? order by o.id", id);
      return { ...e, correctedBy, inputs, outputs } as { id: number; at: number; step: string; corrects: number | null; referenceDoc: string; party: string; user: string; counterparty: string | null; correctedBy: number | null; inputs: Line[]; outputs: Line[] };
    })
    .sort((a, b) => a.at - b.at || a.id - b.id);
}

let office: never;
beforeAll(async () => {
  const admin = await signInAs("admin@example.com");
  office = one("select id, email, name, role, party_id as partyId from users where email = 'admin@example.com'") as never;
  // A shipment to a buyer, returned (a correction) and shipped again: corrections belong in the recall.
  const bottles = one("select code from lots where kind = 'bottled' and quantity_in = 800 order by id").code as string;
  const ship = (quantity: string, referenceDoc: string) => submit(admin, shipToBuyerAction, { code: bottles, counterpartyId: "buyer-minato", date: "2026-12-01", quantity, referenceDoc });
  expect(state(await ship("24", "INV-REF-1")).ok).toBe(true);
  const shipped = one("select id from events where reference_doc = 'INV-REF-1'").id as number;
  expect(state(await submit(admin, correctEventAction, { code: bottles, corrects: String(shipped), reason: "Buyer returned the case" })).ok).toBe(true);
  expect(state(await ship("12", "INV-REF-2")).ok).toBe(true);
});

describe("the recall against a reference walk", () => {
  it("reaches the same lots with the same shares, and lists the same events, for every lot that reaches anything", () => {
    const heads = all<{ id: number; code: string }>("select id, code from lots where exists (select 1 from lineage_edges e where e.parent_lot_id = lots.id) order by id");
    expect(heads.length).toBeGreaterThan(5);
    let corrections = 0;
    for (const head of heads) {
      const recall = loadRecall(office, head.code);
      const shares = walkDown(head.id);
      expect(recall.lots.map((l) => l.code), head.code).toEqual([head.code, ...shares.keys()]);
      for (const lot of recall.lots.slice(1)) expect(lot.fraction, `${head.code} → ${lot.code}`).toBeCloseTo(shares.get(lot.code)!, 9);
      for (const lot of recall.lots) {
        const row = one("select on_hand as onHand, party_id as holder from lots where code = ?", lot.code);
        expect({ onHand: lot.onHand, holder: lot.holder.id }).toEqual(row);
      }

      const ids = all<{ id: number }>("select id from lots where code in (select value from json_each(?))", JSON.stringify(recall.lots.map((l) => l.code))).map((r) => r.id);
      const expected = eventsOf(ids);
      expect(recall.events.map((e) => e.id), head.code).toEqual(expected.map((e) => e.id));
      recall.events.forEach((e, i) => {
        const want = expected[i]!;
        expect({ at: Date.parse(e.at), step: e.step, corrects: e.corrects, correctedBy: e.correctedBy, referenceDoc: e.referenceDoc, party: e.party.name, user: e.user.name, counterparty: e.counterparty?.name ?? null }).toEqual({
          at: want.at, step: want.step, corrects: want.corrects, correctedBy: want.correctedBy, referenceDoc: want.referenceDoc, party: want.party, user: want.user, counterparty: want.counterparty,
        });
        expect(e.inputs.map(({ lot, quantity, use }) => ({ lot, quantity, use }))).toEqual(want.inputs);
        expect(e.outputs.map(({ lot, quantity }) => ({ lot, quantity }))).toEqual(want.outputs);
        for (const line of [...e.inputs, ...e.outputs]) expect(recall.refs.get(line.lot)?.code).toBe(line.lot);
      });
      corrections += recall.events.filter((e) => e.step === "correcting").length;

      // The spreadsheet's lines, read straight from SQLite, are the ones built from the events above.
      expect(recallLines(office, head.code), head.code).toEqual(recallRows(recall));

      // The page reads the shipping events only, the hold action no event: the same lots, the same shipments.
      const shippingOnly = loadRecall(office, head.code, ["shipping"]);
      expect(shippingOnly.lots).toEqual(recall.lots);
      expect(shipmentsToBuyers(recallRows(shippingOnly))).toEqual(shipmentsToBuyers(recallRows(recall)));
      expect(loadRecall(office, head.code, []).lots).toEqual(recall.lots);
    }
    // The shipment's return, at least, reached from every lot above the bottles.
    expect(corrections).toBeGreaterThan(0);
  });
});

describe("the page's table of reached lots", () => {
  const lot = (i: number, shippedToBuyer = false): ReachedLot => ({ code: `L-${i}`, kind: "bottled", unit: "bottle", fraction: 0.1, onHand: 1, holder: "Brewery", recalled: i === 0, shippedToBuyer, hold: null });
  const lots = Array.from({ length: 2 * RECALL_PAGE_SIZE + 7 }, (_, i) => lot(i, i % 10 === 3));

  it("shows a page at a time, every lot on exactly one page, the page number kept within the table", () => {
    const pages = [1, 2, 3].map((page) => pageOfLots(lots, { code: "H1", page, onlyShipped: false }));
    expect(pages.flatMap((p) => p.rows)).toEqual(lots);
    expect(pages.map((p) => [p.from, p.to, p.pages])).toEqual([[1, 25, 3], [26, 50, 3], [51, 57, 3]]);
    expect(pageOfLots(lots, { code: "H1", page: 99, onlyShipped: false }).page).toBe(3);
    for (const odd of [Number.NaN, -4, 0, 1.5]) expect(pageOfLots(lots, { code: "H1", page: odd, onlyShipped: false }).page).toBe(1);
    expect(pageOfLots([], { code: "H1", page: 1, onlyShipped: false })).toMatchObject({ rows: [], from: 0, to: 0, total: 0, pages: 1 });
  });

  it("shows only the lots shipped to buyers when asked, and keeps the view in the address", () => {
    const shipped = pageOfLots(lots, { code: "H1", page: 1, onlyShipped: true });
    expect(shipped.rows).toEqual(lots.filter((l) => l.shippedToBuyer));
    expect(recallHref({ code: "H21-0003", page: 2, onlyShipped: true })).toBe("/recall?code=H21-0003&shipped=1&page=2");
    expect(recallHref({ code: "H21-0003", page: 1, onlyShipped: false })).toBe("/recall?code=H21-0003");
  });
});
