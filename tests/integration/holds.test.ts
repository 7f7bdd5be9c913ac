// Hold and release after a recall (issue 13, item 10). A held lot is neither drawn, shipped,
// dispatched nor bottled until the office releases it: 409 with the catalogue's message, nothing
// written. Holds and releases are rows of an append-only table, audited. Holding stock that may be
// unsafe until it is cleared is the usual food-safety practice (ISO 22005 / EU 178/2002 Art. 18
// ask for the one-step-forward trace the recall gives; the hold itself is common practice).
import { beforeAll, describe, expect, it, vi } from "vitest";
import { translator } from "@/i18n/messages";
import type { FormState } from "@/lib/form-state";
import { getDb, getSqlite } from "@/server/platform/db";
import { currentHold, holdsByCode } from "@/server/trace/holds";
import { POST as postEvent } from "../../app/api/events/route";
import { POST as postHarvest } from "../../app/api/harvests/route";
import { GET as getLotRoute } from "../../app/api/lots/[code]/route";
import { holdRecallAction, releaseRecallAction } from "../../app/(office)/recall/actions";
import { releaseLotAction } from "../../app/(office)/lots/[code]/actions";
import { submit } from "../support/action-scope";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";

vi.mock("next/headers", async () => (await import("../support/action-scope")).nextHeaders);
vi.mock("next/cache", async () => (await import("../support/action-scope")).nextCache);
vi.mock("next-intl/server", async () => (await import("../support/action-scope")).nextIntlServer());

const en = translator("en");
let admin: string, brewer: string, grower: string, sales: string, auditor: string;
const one = (sql: string, ...args: unknown[]) => getSqlite().prepare(sql).get(...args) as Record<string, unknown>;
const all = (sql: string, ...args: unknown[]) => getSqlite().prepare(sql).all(...args) as Record<string, unknown>[];
const event = (cookie: string, body: unknown) => call(postEvent, jsonRequest("/api/events", { cookie, body }));
const state = (answer: Awaited<ReturnType<typeof submit>>): FormState => ("state" in answer ? answer.state : { message: `redirect to ${answer.redirect}` });
const heldCodes = () => new Set(all("select l.code from lots l where (select action from lot_holds h where h.lot_id = l.id order by h.id desc limit 1) = 'hold'").map((r) => r.code as string));

// The seeded 2024 season (src/server/records/seed-brewing.ts): the first harvest reaches Tank 1, its sake
// (1020 L, 720 L of it bottled) and the two bottlings, 200 bottles of which went to Minato.
let harvest2024: string, sake: string, bottles800: string;
beforeAll(async () => {
  [admin, brewer, grower, sales, auditor] = [await signInAs("admin@example.com"), await signInAs("brewer@example.com"), await signInAs("grower@example.com"), await signInAs("sales@example.com"), await signInAs("auditor@example.com")];
  harvest2024 = one("select code from lots where kind = 'harvest' and crop_year = 2024 order by id").code as string;
  sake = one("select code from lots where kind = 'sake' order by id").code as string;
  bottles800 = one("select code from lots where kind = 'bottled' and quantity_in = 800 order by id").code as string;
});

describe("putting a recall's lots on hold", () => {
  it("refuses every role but the office, writing nothing (403)", async () => {
    const before = await tableDigests(["sessions"]);
    for (const cookie of [brewer, grower, sales, auditor]) {
      expect(state(await submit(cookie, holdRecallAction, { code: harvest2024, reason: "Probe: not theirs to hold" }))).toMatchObject({ message: en("errors.forbidden") });
    }
    expect(state(await submit("", holdRecallAction, { code: harvest2024, reason: "Probe" })).message).toBe(en("errors.unauthenticated"));
    expect(await tableDigests(["sessions"])).toEqual(before);
  });

  it("wants a reason and a lot that exists", async () => {
    expect(state(await submit(admin, holdRecallAction, { code: harvest2024, reason: " " })).fields?.reason).toBeTruthy();
    expect(state(await submit(admin, holdRecallAction, { code: "ZZ99-0001", reason: "Probe reason" })).message).toBe(en("errors.not_found"));
    expect(heldCodes().size).toBe(0);
  });

  it("holds every reached lot in one action, audited once with the lots and the reason", async () => {
    const answer = state(await submit(admin, holdRecallAction, { code: harvest2024, reason: "Mould reported on the polished rice" }));
    expect(answer.ok, JSON.stringify(answer)).toBe(true);
    const held = heldCodes();
    for (const code of [harvest2024, sake, bottles800]) expect(held.has(code), code).toBe(true);
    const audit = one("select action, subject, detail from audit_log where action = 'lot.held'");
    expect(audit.subject).toBe(harvest2024);
    expect(JSON.parse(audit.detail as string)).toMatchObject({ reason: "Mould reported on the polished rice", lots: expect.arrayContaining([harvest2024, sake, bottles800]) });
    // Again: every lot is on hold already, so nothing new is written.
    const rows = one("select count(*) as n from lot_holds").n;
    expect(state(await submit(admin, holdRecallAction, { code: harvest2024, reason: "Twice" })).message).toBe(en("holds.heldCount", { count: 0 }));
    expect(one("select count(*) as n from lot_holds").n).toBe(rows);
  });

  it("the floor's lot read says so", async () => {
    const lot = await call(getLotRoute, jsonRequest(`/api/lots/${bottles800}`, { cookie: brewer }), { code: bottles800 });
    expect(lot.body.hold).toMatchObject({ reason: "Mould reported on the polished rice", recallCode: harvest2024 });
  });

  it("keeps hold rows for good: the database refuses UPDATE and DELETE", () => {
    expect(() => getSqlite().prepare("update lot_holds set reason = 'x'").run()).toThrow(/append-only/);
    expect(() => getSqlite().prepare("delete from lot_holds").run()).toThrow(/append-only/);
  });
});

describe("a held lot is not used until released (409, nothing written)", () => {
  const refused = async (cookie: string, body: unknown, code: string) => {
    const before = await tableDigests(["sessions"]);
    const res = await event(cookie, body);
    expect(res.status, JSON.stringify(res.body)).toBe(409);
    expect(res.body.error.message).toBe(en("errors.onHold", { code, reason: "Mould reported on the polished rice" }));
    expect(await tableDigests(["sessions"])).toEqual(before);
  };

  it("shipping bottles to a buyer", () => refused(brewer, { step: "shipping", counterpartyId: "buyer-minato", referenceDoc: "INV-HOLD-1", inputs: [{ lot: bottles800, quantity: 10 }] }, bottles800));
  it("bottling the sake", () => refused(brewer, { step: "bottling", inputs: [{ lot: sake, quantity: 72 }], outputs: [{ kind: "bottled", quantity: 100, bottleMl: 720, gtin: "9506000134352" }] }, sake));
  it("the office's shipment too", () => refused(admin, { step: "shipping", counterpartyId: "buyer-minato", referenceDoc: "INV-HOLD-2", partyId: "brewery-kirinoha", inputs: [{ lot: bottles800, quantity: 10 }] }, bottles800));

  it("dispatching a grower's harvest to the mill", async () => {
    const code = (await call(postHarvest, jsonRequest("/api/harvests", { cookie: grower, body: { fieldId: "field-ikeda-terrace", variety: "Yamada Nishiki", cropYear: 2026, brownKg: 300, moisturePct: 14.8, grade: "1", bags: 5 } }))).body.code as string;
    expect(state(await submit(admin, holdRecallAction, { code, reason: "Mould reported on the polished rice" })).ok).toBe(true);
    await refused(grower, { step: "shipping", counterpartyId: "mill-shirotae", referenceDoc: "DS-HOLD", inputs: [{ lot: code, quantity: 300 }] }, code);
    // A reading moves nothing and is still taken.
    expect((await event(grower, { step: "measuring", inputs: [{ lot: code, quantity: 0 }], measurements: [{ name: "moisturePct", value: 14.6, unit: "%" }] })).status).toBe(201);
  });
});

describe("releasing", () => {
  it("one lot: only the office, with a reason; then it ships again, the rest stay held", async () => {
    expect(state(await submit(brewer, releaseLotAction, { code: bottles800, reason: "Probe" })).message).toBe(en("errors.forbidden"));
    expect(state(await submit(admin, releaseLotAction, { code: bottles800, reason: "" })).fields?.reason).toBeTruthy();
    expect(state(await submit(admin, releaseLotAction, { code: bottles800, reason: "Lab result clear for this bottling" })).ok).toBe(true);
    expect(heldCodes().has(bottles800)).toBe(false);
    expect(heldCodes().has(sake)).toBe(true);
    expect((await event(brewer, { step: "shipping", counterpartyId: "buyer-minato", referenceDoc: "INV-AFTER", inputs: [{ lot: bottles800, quantity: 10 }] })).status).toBe(201);
    // Releasing it again: nothing to release.
    expect(state(await submit(admin, releaseLotAction, { code: bottles800, reason: "Again" })).message).toBe(en("errors.conflict"));
  });

  it("the recall table's holds by code (one statement) say what each lot's newest hold row says", () => {
    // Reference: the per-lot read every drawing step uses, currentHold, on every lot of the ledger.
    const everyLot = all("select id, code from lots").map((r) => ({ id: r.id as number, code: r.code as string }));
    const expected = new Map(everyLot.flatMap((l) => {
      const hold = currentHold(getDb(), l.id);
      return hold ? [[l.code, hold] as const] : [];
    }));
    expect(expected.size).toBeGreaterThan(0);
    expect(holdsByCode(getDb(), everyLot.map((l) => l.code))).toEqual(expected);
    expect(holdsByCode(getDb(), ["ZZ99-0001"])).toEqual(new Map());
  });

  it("all of a recall at once, audited; the history keeps every hold and release", async () => {
    expect(state(await submit(admin, releaseRecallAction, { code: harvest2024, reason: "Authority cleared the batch" })).ok).toBe(true);
    expect(heldCodes().size).toBe(1); // the 2026 harvest held above is not part of this recall
    const audit = one("select detail from audit_log where action = 'lot.released' order by id desc limit 1");
    expect(JSON.parse(audit.detail as string)).toMatchObject({ reason: "Authority cleared the batch", lots: expect.arrayContaining([sake]) });
    const history = all("select h.action from lot_holds h join lots l on l.id = h.lot_id where l.code = ? order by h.id", bottles800).map((r) => r.action);
    expect(history).toEqual(["hold", "release"]);
  });
});
