import { beforeAll, describe, expect, it } from "vitest";
import { POST as postEvent } from "../../app/api/events/route";
import { POST as postHarvest } from "../../app/api/harvests/route";
import { POST as postAdjustment } from "../../app/api/suppliers/[partyId]/adjustments/route";
import { GET as getLedger } from "../../app/api/suppliers/[partyId]/ledger/route";
import { POST as postPayment } from "../../app/api/suppliers/[partyId]/payments/route";
import { GET as getStatementCsv } from "../../app/api/suppliers/[partyId]/statements/[number]/statement.csv/route";
import { GET as getStatementPdf } from "../../app/api/suppliers/[partyId]/statements/[number]/statement.pdf/route";
import { POST as postStatement } from "../../app/api/suppliers/[partyId]/statements/route";
import { getSqlite } from "@/server/platform/db";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";
import { dispatchAndReceive } from "../support/receipts";
import { readPdfText } from "../support/pdf-read";

let admin: string, grower: string, grower2: string, miller: string, auditor: string, brewer: string;

const harvest = (body: Record<string, unknown>) =>
  call(postHarvest, jsonRequest("/api/harvests", { cookie: admin, body: { fieldId: "field-ikeda-terrace", variety: "Yamada Nishiki", cropYear: 2026, brownKg: 600, moisturePct: 14.8, grade: "1", bags: 10, ...body } }));
const event = (cookie: string, body: unknown) => call(postEvent, jsonRequest("/api/events", { cookie, body }));
const ledger = async (cookie: string, partyId: string) => call(getLedger, jsonRequest(`/api/suppliers/${partyId}/ledger`, { cookie }), { partyId });
const balance = async (partyId: string) => (await ledger(admin, partyId)).body.balanceYen as number;
const count = (sql: string, ...args: unknown[]) => (getSqlite().prepare(sql).get(...args) as { n: number }).n;
const today = () => new Date(Date.now() + 9 * 3_600_000).toISOString().slice(0, 10);

beforeAll(async () => {
  admin = await signInAs("admin@example.com");
  grower = await signInAs("grower@example.com");
  grower2 = await signInAs("grower2@example.com");
  miller = await signInAs("miller@example.com");
  auditor = await signInAs("auditor@example.com");
  brewer = await signInAs("brewer@example.com");
});

describe("a grower's receipt, payment and reversal", () => {
  let code = "";
  let receiptId = 0;
  let before = 0;

  it("a receipt creates the payable at the contract price, less the moisture deduction, in the same transaction", async () => {
    before = await balance("grower-ikeda");
    const h = await harvest({ brownKg: 610.5, grade: "1" });
    expect(h.status).toBe(201);
    code = h.body.code;
    // The mill measures 15.3 % at receipt: 3 steps of 0.1 above 15.0 % at 100 yen per bag (seeded contract v2: 27,500 yen a bag for 1st grade).
    const r = await dispatchAndReceive(admin, miller, code, 610.5, { receipt: { referenceDoc: "DS-T-1", measurements: [{ name: "moisturePct", value: 15.3, unit: "%" }] } });
    expect(r.status).toBe(201);
    receiptId = r.body.id;
    const entry = getSqlite().prepare("select amount_yen as amount, tax_rate_pct as rate, kind, json_extract(detail, '$.moistureSteps') as steps from supplier_entries where event_id = ?").get(receiptId) as Record<string, unknown>;
    // (27,500 − 300) × 610.5 kg ÷ 60 kg = 27,200 × 10.175 bags = 276,760 yen, at the reduced rate.
    expect(entry).toEqual({ amount: 276_760, rate: 8, kind: "delivery", steps: 3 });
    // Not yet on a statement: tax as the next statement computes it, 276,760 × 8 % = 22,140.8 → 22,140 (rounded down).
    expect(await balance("grower-ikeda")).toBe(before + 276_760 + 22_140);
    const seen = await ledger(grower, "grower-ikeda");
    expect(seen.body.entries).toContainEqual(expect.objectContaining({ kind: "delivery", amountYen: 276_760, ref: code }));
    expect(seen.body.entries.reduce((a: number, e: { amountYen: number }) => a + e.amountYen, 0)).toBe(seen.body.balanceYen);
  });

  it("a payment changes the balance", async () => {
    const was = await balance("grower-ikeda");
    const res = await call(postPayment, jsonRequest("/api/suppliers/grower-ikeda/payments", { cookie: admin, body: { date: today(), amountYen: 300_000, method: "bank-transfer", reference: "TR-1" } }), { partyId: "grower-ikeda" });
    expect(res.status).toBe(201);
    expect(res.body.balanceYen).toBe(was - 300_000);
    expect(await balance("grower-ikeda")).toBe(was - 300_000);
    const seen = await ledger(grower, "grower-ikeda");
    expect(seen.body.entries).toContainEqual(expect.objectContaining({ kind: "payment", amountYen: -300_000, ref: "TR-1" }));
  });

  it("a reversal of the receipt appends the opposite entry and restores the balance", async () => {
    const res = await event(admin, { step: "correcting", corrects: receiptId, reason: "Lot received twice by mistake" });
    expect(res.status).toBe(201);
    const rows = getSqlite().prepare("select kind, amount_yen as amount, tax_rate_pct as rate from supplier_entries where lot_id = (select id from lots where code = ?) order by id").all(code);
    expect(rows).toEqual([{ kind: "delivery", amount: 276_760, rate: 8 }, { kind: "reversal", amount: -276_760, rate: 8 }]);
    // The delivery and its tax are gone from the balance; the payment stays.
    expect(await balance("grower-ikeda")).toBe(before - 300_000);
  });

  it("refuses to edit or delete supplier records at the database", () => {
    const sqlite = getSqlite();
    for (const table of ["supplier_entries", "supplier_contracts", "supplier_statements", "supplier_statement_entries"]) {
      expect(count(`select count(*) as n from ${table}`), table).toBeGreaterThan(0);
      expect(() => sqlite.prepare(`update ${table} set rowid = rowid`).run(), table).toThrow(/append-only/);
      expect(() => sqlite.prepare(`delete from ${table}`).run(), table).toThrow(/append-only/);
    }
  });
});

describe("a mill's polishing fee", () => {
  it("a run at the mill owes the fee of its tier per kg of brown rice in, at the standard rate", async () => {
    const before = await balance("mill-shirotae");
    const h = await harvest({ fieldId: "field-nakase-shrine", variety: "Omachi", grade: "2", brownKg: 600 });
    await dispatchAndReceive(admin, miller, h.body.code, 600);
    const run = await event(miller, { step: "polishing", inputs: [{ lot: h.body.code, quantity: 600 }], outputs: [{ kind: "polished", quantity: 350 }, { kind: "bran", quantity: 240 }], measurements: [{ name: "targetPolishingRatioPct", value: 58, unit: "%" }] });
    expect(run.status).toBe(201);
    // Seeded tiers: ≤ 60 % costs 45 yen/kg → 600 × 45 = 27,000 yen; 10 % tax 2,700.
    expect(await balance("mill-shirotae")).toBe(before + 27_000 + 2_700);
    // The grower's delivery: 10 bags of 2nd-grade Omachi at 23,500 yen.
    expect(count("select amount_yen as n from supplier_entries where kind = 'delivery' and lot_id = (select id from lots where code = ?)", h.body.code)).toBe(235_000);
  });

  it("records no fee for a run the brewery polishes itself", async () => {
    const h = await harvest({ fieldId: "field-nakase-shrine", variety: "Omachi", grade: "2", brownKg: 120 });
    await dispatchAndReceive(admin, admin, h.body.code, 120, { to: "brewery-kirinoha", receipt: { partyId: "brewery-kirinoha" } });
    const run = await event(admin, { step: "polishing", partyId: "brewery-kirinoha", inputs: [{ lot: h.body.code, quantity: 120 }], outputs: [{ kind: "polished", quantity: 80 }], measurements: [{ name: "targetPolishingRatioPct", value: 70, unit: "%" }] });
    expect(run.status).toBe(201);
    expect(count("select count(*) as n from supplier_entries where event_id = ?", run.body.id)).toBe(0);
  });
});

describe("without a contract price", () => {
  it("records the receipt and owes nothing", async () => {
    const before = await tableDigests();
    const h = await harvest({ fieldId: "field-coop-stone", variety: "Gohyakumangoku", grade: "1", brownKg: 300 });
    const r = await dispatchAndReceive(admin, miller, h.body.code, 300);
    expect(r.status).toBe(201);
    expect(count("select count(*) as n from supplier_entries where event_id = ?", r.body.id)).toBe(0);
    const after = await tableDigests();
    expect(after.events).not.toBe(before.events);
    expect(after.supplier_entries).toBe(before.supplier_entries);
  });
});

describe("who may read and write a supplier's account", () => {
  it("answers another supplier's ledger as unknown (404), any supplier's to the office and the auditor", async () => {
    // A supplier learns nothing of another's account (tests/integration/unseen-unknown.test.ts); a role reading no money keeps 403.
    expect((await ledger(grower, "grower-nakase")).status).toBe(404);
    expect((await ledger(grower2, "grower-ikeda")).status).toBe(404);
    expect((await ledger(miller, "grower-ikeda")).status).toBe(404);
    expect((await ledger(grower, "mill-shirotae")).status).toBe(404);
    expect((await ledger(brewer, "grower-ikeda")).status).toBe(403);
    expect((await ledger(grower2, "grower-nakase")).status).toBe(200);
    expect((await ledger(miller, "mill-shirotae")).status).toBe(200);
    expect((await ledger(auditor, "grower-ikeda")).status).toBe(200);
    expect((await ledger(admin, "buyer-minato")).status).toBe(404);
    expect((await call(getLedger, jsonRequest("/api/suppliers/grower-ikeda/ledger"), { partyId: "grower-ikeda" })).status).toBe(401);
  });

  it("lets only the office record payments; bad input is 422 and changes nothing", async () => {
    const before = await tableDigests();
    const pay = (cookie: string, body: unknown) => call(postPayment, jsonRequest("/api/suppliers/grower-ikeda/payments", { cookie, body }), { partyId: "grower-ikeda" });
    expect((await pay(grower, { date: today(), amountYen: 1, method: "cash" })).status).toBe(403);
    expect((await pay(auditor, { date: today(), amountYen: 1, method: "cash" })).status).toBe(403);
    const bad = await pay(admin, { date: "yesterday", amountYen: 12.5, method: "barter" });
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(["amountYen", "date", "method"]);
    const noReason = await call(postAdjustment, jsonRequest("/api/suppliers/grower-ikeda/adjustments", { cookie: admin, body: { date: today(), amountYen: 500, taxRatePct: 8, reason: "" } }), { partyId: "grower-ikeda" });
    expect(noReason.status).toBe(422);
    expect(noReason.body.error.fields.reason).toBeDefined();
    expect(await tableDigests()).toEqual(before);
  });
});

describe("statements", () => {
  it("issues a statement with tax once per rate, e-mails it, and serves its PDF and CSV to the supplier only", async () => {
    // Two taxable adjustments, so that per-line rounding would differ from the per-rate sum.
    const adjust = (body: Record<string, unknown>) => call(postAdjustment, jsonRequest("/api/suppliers/grower-nakase/adjustments", { cookie: admin, body: { date: today(), ...body } }), { partyId: "grower-nakase" });
    expect((await adjust({ amountYen: 1_234, taxRatePct: 8, reason: "Bag count corrected" })).status).toBe(201);
    expect((await adjust({ amountYen: 2_345, taxRatePct: 8, reason: "=HYPERLINK(\"http://x.invalid\")" })).status).toBe(201);
    const outboxBefore = count("select count(*) as n from outbox");
    // The mail goes in the supplier's own language (Japanese unless a user of the supplier chose another).
    getSqlite().prepare("update users set locale = 'en' where email = 'grower2@example.com'").run();
    const res = await call(postStatement, jsonRequest("/api/suppliers/grower-nakase/statements", { cookie: admin, body: { from: today(), to: today(), email: true } }), { partyId: "grower-nakase" });
    expect(res.status).toBe(201);
    // Today's Nakase deliveries from the tests above: 235,000 (10 bags at the mill) + 47,000 (2 bags at the brewery).
    // 8 %: 285,579 × 0.08 = 22,846.32 → 22,846 once on the sum; line by line it would be 18,800 + 3,760 + 98 + 187 = 22,845.
    expect(res.body.totals.rates).toEqual([{ ratePct: 8, netYen: 285_579, taxYen: 22_846, grossYen: 308_425 }]);
    expect(res.body.balanceYen).toBe(await balance("grower-nakase"));
    expect(count("select count(*) as n from outbox")).toBe(outboxBefore + 1);
    const mail = getSqlite().prepare("select to_address as toAddress, text_body as text from outbox order by created_at desc limit 1").get() as { toAddress: string; text: string };
    expect(mail.toAddress).toBe("nakase@paddies.example");
    expect(mail.text).toContain(`/api/suppliers/grower-nakase/statements/${res.body.number}/statement.pdf`);
    expect(mail.text).toContain("308,425 yen");

    const number = res.body.number as string;
    const pdf = await getStatementPdf(jsonRequest(`/api/suppliers/grower-nakase/statements/${number}/statement.pdf`, { cookie: grower2 }), { params: Promise.resolve({ partyId: "grower-nakase", number }) });
    expect(pdf.status).toBe(200);
    const text = await readPdfText(new Uint8Array(await pdf.arrayBuffer()));
    expect(text).toContain(`Statement ${number}`);
    expect(text).toContain("Nakase Family Paddies");
    expect(text).toMatch(/Subtotal 8 %\*\n285,579 JPY/);
    expect(text).toMatch(/Consumption tax 8 %\n22,846 JPY/);
    expect(text).toMatch(/Total incl. tax\n308,425 JPY/);

    const csvRes = await getStatementCsv(jsonRequest(`/api/suppliers/grower-nakase/statements/${number}/statement.csv`, { cookie: admin }), { params: Promise.resolve({ partyId: "grower-nakase", number }) });
    const csvText = await csvRes.text();
    expect(csvText).toContain("Total incl. tax,,,,308425");
    // OWASP "CSV Injection": a cell starting with = is shown, not run.
    expect(csvText).toContain(`"'=HYPERLINK(""http://x.invalid"")"`);

    const other = await getStatementPdf(jsonRequest(`/api/suppliers/grower-nakase/statements/${number}/statement.pdf`, { cookie: grower }), { params: Promise.resolve({ partyId: "grower-nakase", number }) });
    expect(other.status).toBe(404);
    const wrongParty = await getStatementPdf(jsonRequest(`/api/suppliers/grower-ikeda/statements/${number}/statement.pdf`, { cookie: grower }), { params: Promise.resolve({ partyId: "grower-ikeda", number }) });
    expect(wrongParty.status).toBe(404);
  });

  it("states nothing twice", async () => {
    const again = await call(postStatement, jsonRequest("/api/suppliers/grower-nakase/statements", { cookie: admin, body: { from: today(), to: today() } }), { partyId: "grower-nakase" });
    expect(again.status).toBe(422);
    expect(again.body.error.fields.from).toBeDefined();
  });
});
