import Papa from "papaparse";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as postEvent } from "../../app/api/events/route";
import { POST as postHarvest } from "../../app/api/harvests/route";
import { GET as getTransactions } from "../../app/api/records/transactions.csv/route";
import { csvText } from "@/lib/validation/csv";
import { getDb, getSqlite } from "@/server/platform/db";
import { writeSetting } from "@/server/platform/settings";
import { call, jsonRequest, signInAs } from "../support/api";

let grower: string, grower2: string, miller: string, admin: string;
let h1: string, h2: string, h3: string, polished: string, receipt2: number;

// The demo season is 2026; this file's events are in October 2025, away from it.
const harvest = async (cookie: string, fieldId: string, brownKg: number, variety: string) =>
  (await call(postHarvest, jsonRequest("/api/harvests", { cookie, body: { fieldId, variety, cropYear: 2025, brownKg, moisturePct: 14.6, grade: "1", bags: 5, at: "2025-09-20T09:00:00+09:00" } }))).body.code as string;
const event = async (cookie: string, body: unknown) => {
  const res = await call(postEvent, jsonRequest("/api/events", { cookie, body }));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body;
};
/** The holder's dispatch (dated in September, outside the range the tests read), then the mill's receipt of `quantity` on arrival. */
const receive = async (lot: string, quantity: number, at: string, extra: Record<string, string> = {}, slip = quantity) => {
  const holder = (getSqlite().prepare("select party_id as p from lots where code = ?").get(lot) as { p: string }).p;
  await event(admin, { step: "shipping", partyId: holder, at: "2025-09-20T10:00:00+09:00", inputs: [{ lot, quantity: slip }], counterpartyId: "mill-shirotae", referenceDoc: `DS-${lot}` });
  return event(miller, { step: "receiving", at, inputs: [{ lot, quantity }], referenceDoc: `DS-${lot}`, place: "Shirotae mill yard", ...extra });
};

async function download(cookie: string | undefined, query: string) {
  const response = await getTransactions(jsonRequest(`/api/records/transactions.csv${query}`, { cookie }));
  // Keep the byte-order mark: Response.text() would drop it.
  return { response, text: new TextDecoder("utf-8", { ignoreBOM: true }).decode(await response.arrayBuffer()) };
}
async function records(cookie: string, query = "?from=2025-10-01&to=2025-10-31") {
  const { response, text } = await download(cookie, query);
  expect(response.status).toBe(200);
  return Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });
}

beforeAll(async () => {
  grower = await signInAs("grower@example.com");
  grower2 = await signInAs("grower2@example.com");
  miller = await signInAs("miller@example.com");
  admin = await signInAs("admin@example.com");
  h1 = await harvest(grower, "field-ikeda-terrace", 300, "Yamada Nishiki");
  h2 = await harvest(grower2, "field-nakase-river", 400, "Omachi");
  const h4 = await harvest(grower, "field-ikeda-cedar", 100, "Omachi");
  // 00:10 on 1 October in Japan is still 30 September in UTC: the range is in Japan's days.
  await receive(h1, 300, "2025-10-01T00:10:00+09:00");
  // A classic payload from OWASP's "CSV Injection" page, typed into free-text fields.
  receipt2 = (await receive(h2, 400, "2025-10-03T10:00:00+09:00", { place: "=cmd|' /C calc'!A0", referenceDoc: "@SUM(1+1)" })).id;
  // 702 kg on the slip, 700 kg on arrival: 2 kg short in transit.
  h3 = await harvest(admin, "field-coop-north", 702, "Yamada Nishiki");
  await receive(h3, 700, "2025-10-04T10:00:00+09:00", {}, 702);
  await event(admin, { step: "correcting", at: "2025-10-05T10:00:00+09:00", corrects: receipt2, reason: "Unloaded from the wrong truck" });
  const run = await event(miller, {
    step: "polishing",
    at: "2025-10-06T10:00:00+09:00",
    inputs: [{ lot: h1, quantity: 300 }, { lot: h3, quantity: 700 }],
    outputs: [{ kind: "polished", quantity: 600 }, { kind: "bran", quantity: 385 }],
    measurements: [{ name: "targetPolishingRatioPct", value: 60, unit: "%" }],
  });
  polished = run.outputs[0].code;
  await event(miller, { step: "shipping", at: "2025-10-07T10:00:00+09:00", inputs: [{ lot: polished, quantity: 600 }], counterpartyId: "brewery-kirinoha", referenceDoc: "SH-0007", place: "Shirotae mill yard" });
  // 1 November in Japan, though still 31 October in UTC: outside the range.
  await receive(h4, 100, "2025-11-01T00:30:00+09:00");
});

describe("GET /api/records/transactions.csv", () => {
  it("answers a CSV attachment with the record's columns and one row per lot per receipt or shipment", async () => {
    const { response, text } = await download(admin, "?from=2025-10-01&to=2025-10-31");
    expect(response.headers.get("content-type")).toBe("text/csv; charset=utf-8");
    expect(response.headers.get("content-disposition")).toBe('attachment; filename="grainline-transactions-2025-10-01-to-2025-10-31.csv"');
    expect(text.startsWith("\uFEFFDate,Direction,")).toBe(true);
    const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.meta.fields).toEqual(["Date", "Direction", "Entry", "Product", "Lot code", "Origin", "Quantity", "Unit", "Recording party", "Counterparty", "Place", "Delivery slip", "Recorded by", "Event", "Reverses event", "Slip quantity", "Short in transit"]);
    const pick = (r: Record<string, string>) => [r.Date, r.Direction, r.Entry, r["Lot code"], r.Product, r.Origin, r.Quantity, r.Unit, r["Recording party"], r.Counterparty, r["Recorded by"]];
    expect(parsed.data.map(pick)).toEqual([
      ["2025-10-01", "receipt", "record", h1, "Harvest (brown rice), Yamada Nishiki", "Hyogo", "300", "kg", "Shirotae Polishing Works", "Ikeda Farm", "Ota Kenji"],
      ["2025-10-03", "receipt", "record", h2, "Harvest (brown rice), Omachi", "Hyogo", "400", "kg", "Shirotae Polishing Works", "Nakase Family Paddies", "Ota Kenji"],
      ["2025-10-04", "receipt", "record", h3, "Harvest (brown rice), Yamada Nishiki", "Okayama", "700", "kg", "Shirotae Polishing Works", "Upper Asagiri Growers' Cooperative", "Ota Kenji"],
      ["2025-10-05", "receipt", "reversal", h2, "Harvest (brown rice), Omachi", "Hyogo", "-400", "kg", "Shirotae Polishing Works", "Nakase Family Paddies", "Mori Sachiko"],
      // Polished from 300 kg of Hyogo and 700 kg of Okayama brown rice: several origins,
      // heaviest first (MAFF, rice traceability law: origin wording).
      ["2025-10-07", "shipment", "record", polished, "Polished rice, Yamada Nishiki", "Okayama, Hyogo", "600", "kg", "Shirotae Polishing Works", "Kirinoha Brewery", "Ota Kenji"],
    ]);
    expect(parsed.data[0]).toMatchObject({ Place: "Shirotae mill yard", "Delivery slip": `DS-${h1}`, "Reverses event": "" });
    expect(parsed.data[3]!["Reverses event"]).toBe(String(receipt2));
    expect(parsed.data[4]!["Delivery slip"]).toBe("SH-0007");
    // The receipt of a dispatch keeps the slip's weight and the loss in transit beside the weight received.
    expect(parsed.data[2]).toMatchObject({ Quantity: "700", "Slip quantity": "702", "Short in transit": "2" });
    expect(parsed.data[3]).toMatchObject({ Quantity: "-400", "Slip quantity": "-400" });
  });

  it("neutralises cells that a spreadsheet would run as formulas", async () => {
    const { data } = await records(admin);
    // OWASP "CSV Injection": a leading apostrophe makes the cell text; numbers are left alone.
    expect(data[1]).toMatchObject({ Place: "'=cmd|' /C calc'!A0", "Delivery slip": "'@SUM(1+1)" });
    expect(data[3]).toMatchObject({ Place: "'=cmd|' /C calc'!A0", Quantity: "-400" });
    const text = csvText(["cell"], [["=1+2"], ["+81 790"], ["-2+3"], ["@A1"], ["\tx"], [-5], ["plain"]]);
    expect(Papa.parse<string[]>(text, { skipEmptyLines: true }).data.slice(1).map((r) => r[0])).toEqual(["'=1+2", "'+81 790", "'-2+3", "'@A1", "'\tx", "-5", "plain"]);
  });

  it("shows growers and mills only the rows where their party is a party or the counterparty", async () => {
    expect((await records(grower)).data.map((r) => [r["Lot code"], r.Entry])).toEqual([[h1, "record"]]);
    expect((await records(grower2)).data.map((r) => [r["Lot code"], r.Entry])).toEqual([[h2, "record"], [h2, "reversal"]]);
    expect((await records(miller)).data.map((r) => r["Lot code"])).toEqual([h1, h2, h3, h2, polished]);
  });

  it("answers 422 with field errors for bad dates and for a range that ends before it starts", async () => {
    const bad = await download(admin, "?from=2025-02-30&to=2025-10-31");
    expect(bad.response.status).toBe(422);
    expect(Object.keys(JSON.parse(bad.text).error.fields)).toEqual(["from"]);
    const reversed = await download(admin, "?from=2025-10-31&to=2025-10-01");
    expect(reversed.response.status).toBe(422);
    expect(JSON.parse(reversed.text).error.fields).toEqual({ to: ["The end date comes before the start date."] });
    const missing = await download(admin, "");
    expect(Object.keys(JSON.parse(missing.text).error.fields).sort()).toEqual(["from", "to"]);
    expect((await download(undefined, "?from=2025-10-01&to=2025-10-31")).response.status).toBe(401);
  });
});

describe("the record's days follow the brewery's time zone", () => {
  // IANA tz database: Asia/Tokyo is UTC+9 all year; Europe/London is UTC+1 (BST) until 26 October 2025.
  // h1's receipt is 00:10 on 1 October in Tokyo, 16:10 on 30 September in London.
  it("a receipt moves to the day before, and into a range ending then, when the brewery keeps London time", async () => {
    const rows = async (query: string) => (await records(admin, query)).data.filter((r) => r["Lot code"] === h1 && r.Direction === "receipt").map((r) => r.Date);
    expect(await rows("?from=2025-10-01&to=2025-10-01")).toEqual(["2025-10-01"]);
    expect(await rows("?from=2025-09-30&to=2025-09-30")).toEqual([]);
    writeSetting(getDb(), "timeZone", "Europe/London", "user-admin");
    try {
      expect(await rows("?from=2025-09-30&to=2025-09-30")).toEqual(["2025-09-30"]);
      expect(await rows("?from=2025-10-01&to=2025-10-01")).toEqual([]);
    } finally {
      getSqlite().prepare("delete from settings where key = 'timeZone'").run();
    }
  });
});
