// Shipments to buyers from the office's lot page (issue 13, item 9). The rice traceability act
// (MAFF, ../shared/references.md) asks for every shipment's counterparty, date, quantity and
// document; the recall (21 CFR 1 Subpart S key data elements, as a template) must reach it.
// Returns are corrections of the shipment; a partial return is the shipment corrected and
// recorded again with the quantity the buyer kept.
import { beforeAll, describe, expect, it, vi } from "vitest";
import { translator } from "@/i18n/messages";
import type { FormState } from "@/lib/form-state";
import { getSqlite } from "@/server/platform/db";
import { loadRecall, recallRows, shipmentsToBuyers } from "@/server/trace/recall";
import { correctEventAction, shipToBuyerAction } from "../../app/(office)/lots/[code]/actions";
import { submit } from "../support/action-scope";
import { signInAs, tableDigests } from "../support/api";

vi.mock("next/headers", async () => (await import("../support/action-scope")).nextHeaders);
vi.mock("next/cache", async () => (await import("../support/action-scope")).nextCache);
vi.mock("next-intl/server", async () => (await import("../support/action-scope")).nextIntlServer());

const en = translator("en");
let admin: string, grower: string, miller: string, sales: string;
let bottles: string, harvest2024: string;
const one = (sql: string, ...args: unknown[]) => getSqlite().prepare(sql).get(...args) as Record<string, unknown>;
const state = (answer: Awaited<ReturnType<typeof submit>>): FormState => ("state" in answer ? answer.state : { message: `redirect to ${answer.redirect}` });
const onHand = () => one("select on_hand as n from lots where code = ?", bottles).n as number;
const ship = (cookie: string, extra: Record<string, string> = {}) =>
  submit(cookie, shipToBuyerAction, { code: bottles, counterpartyId: "buyer-minato", date: "2026-12-01", quantity: "24", referenceDoc: "INV-2026-120", ...extra });
/** The recall as the sales office reads it (the recall page's own functions). */
const recallOf = async () => {
  const user = one("select id, email, name, role, party_id as partyId from users where email = 'sales@example.com'") as never;
  return shipmentsToBuyers(recallRows(loadRecall(user, harvest2024)));
};

beforeAll(async () => {
  [admin, grower, miller, sales] = [await signInAs("admin@example.com"), await signInAs("grower@example.com"), await signInAs("miller@example.com"), await signInAs("sales@example.com")];
  // The seeded 2024 season: 800 bottles of 720 mL from the first harvest's sake, all still in the brewery.
  bottles = one("select code from lots where kind = 'bottled' and quantity_in = 800 order by id").code as string;
  harvest2024 = one("select code from lots where kind = 'harvest' and crop_year = 2024 order by id").code as string;
});

describe("a shipment to a buyer from the lot page", () => {
  it("is refused to roles that ship nothing, and to a lot the role cannot see, as an unknown lot; nothing written", async () => {
    const before = await tableDigests(["sessions"]);
    for (const cookie of [grower, sales]) expect(state(await ship(cookie)).message).toBe(en("errors.forbidden"));
    // The mill neither holds nor made the bottles: the same answer as a code that does not exist.
    const unseen = state(await ship(miller));
    const missing = state(await ship(miller, { code: "BT99-0001" }));
    expect(unseen.fields?.code).toEqual([en("validation.unknownLot")]);
    expect(missing.fields).toEqual(unseen.fields);
    expect(await tableDigests(["sessions"])).toEqual(before);
  });

  it("goes only to a buyer (a mill or brewery is a dispatch), in whole bottles, with a slip", async () => {
    expect(state(await ship(admin, { counterpartyId: "mill-shirotae" })).fields?.counterpartyId).toEqual([en("errors.notABuyer")]);
    expect(state(await ship(admin, { quantity: "2.5" })).fields?.quantity).toEqual([en("floor.wholeBottles")]);
    expect(state(await ship(admin, { referenceDoc: "" })).fields?.referenceDoc).toBeTruthy();
    expect(state(await ship(admin, { quantity: "100000" })).fields?.["inputs.0.quantity"]).toBeTruthy();
    expect(onHand()).toBe(800);
  });

  it("draws the bottles, and the recall reaches it with buyer, date, quantity and slip", async () => {
    const answer = state(await ship(admin));
    expect(answer).toMatchObject({ ok: true, message: en("shipments.recorded", { amount: "24 bottles", buyer: "Minato Liquor Wholesale" }) });
    expect(onHand()).toBe(776);
    const shipment = (await recallOf()).find((s) => s.referenceDoc === "INV-2026-120");
    expect(shipment).toMatchObject({ lot: bottles, counterparty: "Minato Liquor Wholesale", quantity: 24, unit: "bottle", correctedBy: null, party: "Kirinoha Brewery" });
    expect(shipment!.at.slice(0, 10)).toBe("2026-12-01");
  });

  it("a return is a correction: the bottles come back and the recall marks the shipment corrected", async () => {
    const id = one("select id from events where reference_doc = 'INV-2026-120'").id as number;
    // Half came back: correct the shipment, then record the 12 the buyer kept.
    expect(state(await submit(admin, correctEventAction, { code: bottles, corrects: String(id), reason: "Buyer returned 12 bottles (damaged labels)" })).ok).toBe(true);
    expect(onHand()).toBe(800);
    expect(state(await ship(admin, { quantity: "12", referenceDoc: "INV-2026-120R" })).ok).toBe(true);
    expect(onHand()).toBe(788);
    const shipments = await recallOf();
    expect(shipments.find((s) => s.referenceDoc === "INV-2026-120")!.correctedBy).not.toBeNull();
    expect(shipments.find((s) => s.referenceDoc === "INV-2026-120R")).toMatchObject({ quantity: 12, correctedBy: null });
  });
});
