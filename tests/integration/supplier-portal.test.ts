import { describe, expect, it } from "vitest";
import { GET as getTrace } from "../../app/api/trace/[code]/route";
import { DEMO_USERS } from "@/server/records/seed";
import { getDb, getSqlite } from "@/server/platform/db";
import type { SessionUser } from "@/server/accounts/session";
import { addGrowerContract, currentGrowerContract, listContracts } from "@/server/suppliers/supplier-contracts";
import { ledgerOf, listSupplierBalances } from "@/server/suppliers/supplier-ledger";
import { recordAdjustment, setInvoiceNumber } from "@/server/suppliers/supplier-office";
import { deliveriesOf, growerPortal, millPortal } from "@/server/suppliers/supplier-portal";
import { saveTaxRounding } from "@/server/suppliers/supplier-settings";
import { translator } from "@/i18n/messages";
import type { Translate } from "@/lib/validation/field-errors";
import { call, jsonRequest, signInAs } from "../support/api";

const en = translator("en");
const t: Translate = (key, values) => en(key as never, values as never);
const as = (id: string): SessionUser => DEMO_USERS.find((u) => u.id === id)!;
const rows = (sql: string, ...args: unknown[]) => getSqlite().prepare(sql).all(...args) as Record<string, unknown>[];

describe("the seeded supplier accounts", () => {
  // Every figure below is worked by hand from the seeded (invented) contracts: price per
  // 60 kg bag × kg ÷ 60, fee per kg × brown kg, 8 % / 10 % tax once per statement, rounded down.
  it("prices the seeded receipts and runs at the contract in force when they were recorded", () => {
    const amounts = rows("select l.code, e.amount_yen as amount from supplier_entries e join lots l on l.id = e.lot_id where e.kind = 'delivery' order by l.code");
    expect(amounts).toEqual([
      { code: "H24-0001", amount: 675_000 }, // 1,500 kg = 25 bags × 27,000 (1st grade)
      { code: "H24-0003", amount: 690_000 }, // 1,800 kg = 30 bags × 23,000 (2nd grade)
      { code: "H26-0001", amount: 825_000 }, // 30 bags × 27,500: version 2 of the contract, not 26,500 of version 1
      { code: "H26-0002", amount: 520_000 }, // 20 bags × 26,000
      { code: "H26-0003", amount: 1_000_000 }, // 40 bags × 25,000; 15.0 % is not above 15.0 %
      { code: "H26-0004", amount: 330_000 }, // 15 bags × 22,000 (3rd grade)
      { code: "H26-0005", amount: 1_450_000 }, // 50 bags × 29,000 (tokuto)
      { code: "H26-0006", amount: 582_500 }, // 25 bags × 23,300
    ]);
    const fees = rows("select kind, amount_yen as amount from supplier_entries where party_id = 'mill-shirotae' and kind <> 'payment' order by id").map((r) => r.amount);
    // 2,000 kg × 60 (≤ 50 %), 2,300 × 45 (≤ 60 %), 3,000 × 60, 2,400 × 35 (≤ 70 %), 3,000 × 45, 900 × 45 reversed, 900 × 45.
    expect(fees).toEqual([120_000, 103_500, 180_000, 84_000, 135_000, 40_500, -40_500, 40_500]);
  });

  it("leaves the cooperative's 2024 delivery without a price: it has no 2024 contract", () => {
    const unpriced = deliveriesOf("grower-coop").filter((d) => d.amountYen === null);
    expect(unpriced.map((d) => [d.code, d.cropYear])).toEqual([["H24-0002", 2024]]);
  });

  it("balances: 2024 paid in full, autumn 2026 stated and owed (less Ikeda's advance)", () => {
    const balances = Object.fromEntries(listSupplierBalances(as("user-admin")).map((b) => [b.id, b.balanceYen]));
    expect(balances).toEqual({
      "grower-ikeda": 1_345_000 + 107_600 - 500_000, // 8 % of 1,345,000 = 107,600
      "grower-nakase": 1_330_000 + 106_400,
      "grower-coop": 2_032_500 + 162_600,
      "mill-shirotae": 439_500 + 43_950, // 10 % of 439,500
    });
    const ledger = ledgerOf(getDb(), "grower-ikeda");
    expect(ledger.lines.reduce((a, l) => a + l.amountYen, 0)).toBe(ledger.balanceYen);
  });

  it("puts one statement per supplier in the outbox, linked to its PDF", () => {
    // In each supplier's language: Japanese, as none of the demo suppliers' users chose another.
    const mails = rows("select to_address as toAddress, subject, text_body as text from outbox where text_body like '%/statement.pdf%' order by created_at, rowid");
    expect(mails.map((m) => m.toAddress)).toEqual(["ikeda@farm.example", "nakase@paddies.example", "coop@asagiri.example", "works@shirotae.example"]);
    expect(mails[0]!.subject).toMatch(/仕入明細書 S-\d{4}-\d{4}/);
    expect(mails[0]!.text).toContain("税込合計：1,452,600円");
    expect(mails[0]!.text).toMatch(/\/api\/suppliers\/grower-ikeda\/statements\/S-\d{4}-\d{4}\/statement\.pdf/);
  });
});

describe("the grower's pages", () => {
  it("show only the grower's own lots, deliveries and money — the queries are bound to the session's party", () => {
    const ikeda = growerPortal(as("user-grower"));
    const own = new Set(rows("select code from lots where kind = 'harvest' and origin_party_id = 'grower-ikeda'").map((r) => r.code));
    expect(ikeda.harvests.map((h) => h.code).sort()).toEqual([...own].sort());
    expect(ikeda.deliveries.every((d) => own.has(d.code))).toBe(true);
    expect(ikeda.ledger.entries.every((e) => e.partyId === "grower-ikeda")).toBe(true);
    const nakase = growerPortal(as("user-grower2"));
    expect(nakase.harvests.some((h) => own.has(h.code))).toBe(false);
    expect(nakase.ledger.balanceYen).not.toBe(ikeda.ledger.balanceYen);
    expect(() => growerPortal(as("user-miller"))).toThrow();
    expect(() => millPortal(as("user-grower"))).toThrow();
  });

  it("trace each harvest lot forward to tanks and bottlings with the same shares as the trace API", async () => {
    const ikeda = growerPortal(as("user-grower"));
    const h24 = ikeda.harvests.find((h) => h.code === "H24-0001")!;
    expect(h24.destinations.map((d) => d.kind)).toEqual(expect.arrayContaining(["tank", "bottled"]));
    const api = await call(getTrace, jsonRequest("/api/trace/H24-0001?direction=forward", { cookie: await signInAs("grower@example.com") }), { code: "H24-0001" });
    for (const d of h24.destinations) {
      const reached = api.body.reached.find((r: { code: string }) => r.code === d.code);
      expect(reached.fraction).toBeCloseTo(d.fraction, 9);
    }
    // Tank 1 took all of the 50 % run, 1,500 of whose 2,000 kg brown rice were Ikeda's (seed-brewing.ts): 75 %.
    expect(h24.destinations.find((d) => d.kind === "tank")!.fraction).toBeCloseTo(0.75, 9);
  });
});

describe("contracts and master data", () => {
  it("appends a new version that prices from then on, and keeps the old one", () => {
    const admin = as("user-admin");
    const v = addGrowerContract(admin, "grower-nakase", { variety: "Omachi", cropYear: 2026, prices: { "1": "26000" }, moistureStepPct: "0.1", moistureDeductionYen: "50" }, t);
    expect(v.version).toBe(2);
    expect(currentGrowerContract(getDb(), "grower-nakase", "Omachi", 2026)?.terms.pricesPerBagYen).toEqual({ "1": 26_000 });
    const omachi = listContracts("grower-nakase").filter((c) => c.variety === "Omachi" && c.cropYear === 2026);
    expect(omachi.map((c) => [c.version, c.superseded])).toEqual([[2, false], [1, true]]);
    expect(() => addGrowerContract(as("user-grower2"), "grower-nakase", { variety: "Omachi", cropYear: 2026, prices: { "1": "99999" }, moistureStepPct: "1", moistureDeductionYen: "0" }, t)).toThrow(/role/);
    expect(() => addGrowerContract(admin, "mill-shirotae", { variety: "Omachi", cropYear: 2026, prices: { "1": "1" }, moistureStepPct: "1", moistureDeductionYen: "0" }, t)).toThrow();
  });

  it("checks the registered invoice number's format: T and 13 digits", () => {
    const admin = as("user-admin");
    expect(() => setInvoiceNumber(admin, "grower-nakase", { invoiceNumber: "T123" }, t)).toThrow();
    expect(setInvoiceNumber(admin, "grower-nakase", { invoiceNumber: "t 0000-0000-00202" }, t)).toEqual({ invoiceNumber: "T0000000000202" });
    expect(rows("select invoice_number as n from parties where id = 'grower-nakase'")).toEqual([{ n: "T0000000000202" }]);
    expect(rows("select action from audit_log where subject = 'grower-nakase' order by id desc limit 1")).toEqual([{ action: "party.updated" }]);
  });

  it("changes the rounding for statements to come; open tax follows it", () => {
    const admin = as("user-admin");
    // An open (not yet stated) price correction of 1,001 yen at 8 %: 80.08 yen of tax.
    const { balanceYen: roundedDown } = recordAdjustment(admin, "grower-ikeda", { date: "2026-11-25", amountYen: "1001", taxRatePct: "8", reason: "Scale recalibrated" }, t);
    expect(saveTaxRounding(admin, { rounding: "up" }, t)).toEqual({ rounding: "up" });
    expect(ledgerOf(getDb(), "grower-ikeda").balanceYen).toBe(roundedDown + 1);
    expect(() => saveTaxRounding(admin, { rounding: "bankers" }, t)).toThrow();
    expect(() => saveTaxRounding(as("user-auditor"), { rounding: "down" }, t)).toThrow(/role/);
    saveTaxRounding(admin, { rounding: "down" }, t);
  });
});
