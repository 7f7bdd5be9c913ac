// A receipt needs the sender's word (issue 12, items 1 and 4): a receipt moves a lot only when it
// answers the holder's dispatch to the receiver; anything else waits for the sender, with one answer
// whatever the code named. The rice traceability act (MAFF, ../shared/references.md) asks for the
// quantity of each receipt and shipment: the slip weight, the weight on arrival, and the loss between.
import { beforeAll, describe, expect, it, vi } from "vitest";
import { translator } from "@/i18n/messages";
import { getSqlite } from "@/server/platform/db";
import { POST as postEvent } from "../../app/api/events/route";
import { POST as postHarvest } from "../../app/api/harvests/route";
import { GET as getLotRoute } from "../../app/api/lots/[code]/route";
import { confirmReceiptAction, declineReceiptAction } from "../../app/(office)/dispatch/actions";
import { submit } from "../support/action-scope";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";

vi.mock("next/headers", async () => (await import("../support/action-scope")).nextHeaders);
vi.mock("next/cache", async () => (await import("../support/action-scope")).nextCache);
vi.mock("next-intl/server", async () => (await import("../support/action-scope")).nextIntlServer());

const en = translator("en");
let grower: string, grower2: string, miller: string, admin: string;

const harvest = async (cookie: string, brownKg: number) =>
  (await call(postHarvest, jsonRequest("/api/harvests", { cookie, body: { fieldId: "field-ikeda-terrace", variety: "Yamada Nishiki", cropYear: 2026, brownKg, moisturePct: 14.8, grade: "1", bags: 10 } }))).body.code as string;
const event = (cookie: string, body: unknown) => call(postEvent, jsonRequest("/api/events", { cookie, body }));
const receive = (code: string, quantity: number, extra: Record<string, unknown> = {}) => event(miller, { step: "receiving", inputs: [{ lot: code, quantity }], referenceDoc: "DS-R-1", ...extra });
const dispatch = (cookie: string, code: string, quantity: number, to = "mill-shirotae") => event(cookie, { step: "shipping", inputs: [{ lot: code, quantity }], counterpartyId: to, referenceDoc: `DS-${code}` });
const row = (sql: string, ...args: unknown[]) => getSqlite().prepare(sql).get(...args) as Record<string, unknown> | undefined;
const holderOf = (code: string) => row("select party_id as party, in_transit_to as transit, on_hand as onHand from lots where code = ?", code);
const deliveriesFor = (code: string) => row("select count(*) as n from supplier_entries e join lots l on l.id = e.lot_id where l.code = ? and e.kind = 'delivery'", code)!.n;
const lastRequest = () => row("select max(id) as id from receipt_requests")!.id as number;
const AWAITING = { id: null, awaiting: "sender", outputs: [], warnings: [] };

beforeAll(async () => {
  grower = await signInAs("grower@example.com");
  grower2 = await signInAs("grower2@example.com");
  miller = await signInAs("miller@example.com");
  admin = await signInAs("admin@example.com");
});

describe("a receipt without the sender's dispatch", () => {
  it("leaves the grower's harvest with the grower and books no payable: it waits for the sender", async () => {
    const code = await harvest(grower, 600);
    const before = await tableDigests(["receipt_requests"]);
    const res = await receive(code, 600);
    // Before: 201, the lot moved to the mill and a delivery was owed to the grower.
    expect(res.status).toBe(202);
    expect(res.body).toEqual(AWAITING);
    expect(holderOf(code)).toEqual({ party: "grower-ikeda", transit: null, onHand: 600 });
    expect(deliveriesFor(code)).toBe(0);
    expect(await tableDigests(["receipt_requests"])).toEqual(before);
    expect(row("select code, quantity, receiver_party_id as receiver from receipt_requests where id = ?", lastRequest())).toEqual({ code, quantity: 600, receiver: "mill-shirotae" });
  });

  it("answers the same for an unknown code, another party's lot and a real undispatched harvest", async () => {
    const real = await harvest(grower, 610);
    const bottled = row("select code from lots where kind = 'bottled' and party_id = 'brewery-kirinoha' limit 1")!.code as string;
    const answers = [await receive("H26-9999", 610), await receive(bottled, 610), await receive(real, 610)];
    // Before: 422 "No lot has this code." for the first two, 201 for the third.
    for (const a of answers) expect({ status: a.status, body: a.body }).toEqual({ status: 202, body: AWAITING });
    expect(holderOf(bottled)!.party).toBe("brewery-kirinoha");
  });
});

describe("dispatch, then receipt", () => {
  it("moves custody at the receipt, with slip, arrival and shortfall kept apart; the payable is priced on arrival", async () => {
    const code = await harvest(grower, 600);
    expect((await dispatch(grower, code, 600)).status).toBe(201);
    expect(holderOf(code)).toEqual({ party: "grower-ikeda", transit: "mill-shirotae", onHand: 600 });
    // Addressed to the mill, so the mill sees it now; the other grower still does not.
    expect((await call(getLotRoute, jsonRequest(`/api/lots/${code}`, { cookie: miller }), { code })).status).toBe(200);
    expect((await call(getLotRoute, jsonRequest(`/api/lots/${code}`, { cookie: grower2 }), { code })).status).toBe(404);
    // In transit: the grower can neither send it again nor measure it away.
    expect((await dispatch(grower, code, 600, "brewery-kirinoha")).status).toBe(409);
    // Heavier than the slip is refused: on hand cannot grow in transit.
    expect((await receive(code, 600.5)).status).toBe(422);

    const res = await receive(code, 597);
    expect(res.status).toBe(201);
    expect(holderOf(code)).toEqual({ party: "mill-shirotae", transit: null, onHand: 597 });
    const attributes = JSON.parse(row("select attributes from events where id = ?", res.body.id)!.attributes as string);
    expect(attributes).toMatchObject({ slipQuantity: 600, arrivalQuantity: 597, shortfall: 3 });
    const inputs = getSqlite().prepare("select use, quantity from event_inputs where event_id = ? order by id").all(res.body.id);
    expect(inputs).toEqual([{ use: "move", quantity: 597 }, { use: "loss", quantity: 3 }]);
    // Seeded contract v2: 27,500 yen a 60 kg bag for 1st grade; 597 kg = 9.95 bags = 273,625 yen (the slip's 600 kg would be 275,000).
    expect(row("select amount_yen as amount, json_extract(detail, '$.kg') as kg from supplier_entries where event_id = ?", res.body.id)).toEqual({ amount: 273_625, kg: 597 });
  });

  it("refuses a receipt dated before the dispatch, and changes nothing", async () => {
    const code = await harvest(grower, 400);
    expect((await event(grower, { step: "shipping", at: "2026-10-05T09:00:00+09:00", inputs: [{ lot: code, quantity: 400 }], counterpartyId: "mill-shirotae", referenceDoc: "DS-EARLY" })).status).toBe(201);
    const before = await tableDigests();
    const res = await receive(code, 400, { at: "2026-10-04T12:00:00+09:00" });
    expect(res.status).toBe(422);
    expect(res.body.error.fields.at).toEqual([en("validation.receiptBeforeDispatch", { date: "2026-10-05" })]);
    expect(await tableDigests()).toEqual(before);
    expect(holderOf(code)).toEqual({ party: "grower-ikeda", transit: "mill-shirotae", onHand: 400 });
  });

  it("a correction of the receipt hands the lot back, still on its way; correcting the dispatch then calls it back", async () => {
    const code = await harvest(grower, 300);
    const sent = await dispatch(grower, code, 300);
    const received = await receive(code, 298);
    const undo = await event(miller, { step: "correcting", corrects: received.body.id, reason: "Weighed on the wrong scale" });
    expect(undo.status).toBe(201);
    expect(holderOf(code)).toEqual({ party: "grower-ikeda", transit: "mill-shirotae", onHand: 300 });
    expect((await event(grower, { step: "correcting", corrects: sent.body.id, reason: "The truck never left" })).status).toBe(201);
    expect(holderOf(code)).toEqual({ party: "grower-ikeda", transit: null, onHand: 300 });
  });

  it("refuses a dispatch by anyone who does not hold the lot, and changes nothing", async () => {
    const code = await harvest(grower, 250);
    const brewer = await signInAs("brewer@example.com");
    const before = await tableDigests();
    // Another grower and the mill cannot see it (unknown, 422); the office's brewer sees every lot but holds none of it (403).
    expect((await dispatch(grower2, code, 250)).status).toBe(422);
    expect((await dispatch(miller, code, 250, "brewery-kirinoha")).status).toBe(422);
    expect((await dispatch(brewer, code, 250)).status).toBe(403);
    expect(await tableDigests()).toEqual(before);
  });
});

describe("the sender's answer to a receipt awaiting it", () => {
  it("is refused to the wrong party: another grower is told it does not exist, the receiver that the sender answers", async () => {
    const code = await harvest(grower, 420);
    await receive(code, 418);
    const id = String(lastRequest());
    const before = await tableDigests();
    const other = await submit(grower2, confirmReceiptAction, { requestId: id });
    const missing = await submit(grower2, confirmReceiptAction, { requestId: "999999" });
    // The same answer; only the form's own values, sent back to refill it, differ.
    const answer = (r: Awaited<typeof other>) => ("state" in r ? { ...r.state, values: undefined } : r);
    expect(answer(other)).toEqual(answer(missing));
    expect(other).toMatchObject({ state: { message: en("errors.not_found") } });
    expect(await submit(miller, confirmReceiptAction, { requestId: id })).toMatchObject({ state: { message: en("errors.forbidden") } });
    expect(await tableDigests()).toEqual(before);
  });

  it("confirmed by the holder: dispatch and receipt in one transaction, custody moves, the payable is booked", async () => {
    const code = await harvest(grower, 480);
    await receive(code, 477, { measurements: [{ name: "moisturePct", value: 14.9, unit: "%" }] });
    const id = String(lastRequest());
    expect(await submit(grower, confirmReceiptAction, { requestId: id })).toMatchObject({ state: { ok: true } });
    expect(holderOf(code)).toEqual({ party: "mill-shirotae", transit: null, onHand: 477 });
    expect(deliveriesFor(code)).toBe(1);
    const steps = getSqlite().prepare("select e.step from events e join event_inputs i on i.event_id = e.id join lots l on l.id = i.lot_id where l.code = ? and i.use <> 'loss' order by e.id").pluck().all(code);
    expect(steps).toEqual(["shipping", "receiving"]);
    expect(row("select outcome from receipt_outcomes where request_id = ?", Number(id))).toEqual({ outcome: "confirmed" });
    // Answered once.
    expect(await submit(admin, confirmReceiptAction, { requestId: id })).toMatchObject({ state: { message: en("errors.conflict") } });
  });

  it("declined: the decline is on record with its reason, and nothing else changes", async () => {
    const code = await harvest(grower, 350);
    await receive(code, 350);
    const id = String(lastRequest());
    const before = await tableDigests(["receipt_outcomes"]);
    expect(await submit(grower, declineReceiptAction, { requestId: id, reason: "Not our delivery" })).toMatchObject({ state: { ok: true } });
    expect(await tableDigests(["receipt_outcomes"])).toEqual(before);
    expect(holderOf(code)).toEqual({ party: "grower-ikeda", transit: null, onHand: 350 });
    expect(row("select outcome, reason from receipt_outcomes where request_id = ?", Number(id))).toEqual({ outcome: "declined", reason: "Not our delivery" });
  });
});
