import Papa from "papaparse";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as postEvent } from "../../app/api/events/route";
import { POST as postHarvest } from "../../app/api/harvests/route";
import { GET as traceRoute } from "../../app/api/trace/[code]/route";
import { GET as recallRoute } from "../../app/api/trace/[code]/recall.csv/route";
import { getSqlite } from "@/server/platform/db";
import { call, jsonRequest, signInAs } from "../support/api";

const COLUMNS = ["Date", "Lot code", "Product", "Quantity", "Unit", "Entry", "Event", "Location", "Counterparty", "Reference document", "Share from recalled lot", "Recording party", "Recorded by", "Event ID", "Reverses event", "Reversed by event", "Reason for reversal"] as const;
type Row = Record<(typeof COLUMNS)[number], string>;
let sales: string, grower: string, miller: string, auditor: string;
let harvest2024: string;

async function download(code: string, cookie?: string) {
  const response = await recallRoute(jsonRequest(`/api/trace/${encodeURIComponent(code)}/recall.csv`, { cookie }), { params: Promise.resolve({ code }) });
  // Keep the byte-order mark: Response.text() would drop it.
  return { response, text: new TextDecoder("utf-8", { ignoreBOM: true }).decode(await response.arrayBuffer()) };
}
async function recallRows(code: string, cookie = sales): Promise<Row[]> {
  const { response, text } = await download(code, cookie);
  expect(response.status, text).toBe(200);
  const parsed = Papa.parse<Row>(text, { header: true, skipEmptyLines: true });
  expect(parsed.errors).toEqual([]);
  return parsed.data;
}
const forward = async (code: string) => (await call(traceRoute, jsonRequest(`/api/trace/${code}?direction=forward`, { cookie: sales }), { code })).body as { reached: { code: string; kind: string; fraction: number }[] };
const of = (rows: Row[], lot: string, entry?: string) => rows.filter((r) => r["Lot code"] === lot && (!entry || r.Entry === entry));

beforeAll(async () => {
  [sales, grower, miller, auditor] = [await signInAs("sales@example.com"), await signInAs("grower@example.com"), await signInAs("miller@example.com"), await signInAs("auditor@example.com")];
  harvest2024 = (getSqlite().prepare("select code from lots where kind = 'harvest' and crop_year = 2024 order by id").get() as { code: string }).code;
});

// The seeded 2024–25 season (src/server/records/seed-brewing.ts): the first harvest, 1500 kg of Yamada
// Nishiki, polished with 500 kg of another lot into P24-…, brewed as Tank 1 (600 kg of rice),
// pressed to 1020 L (600 × 1.7), bottled as 800 and 200 × 720 mL, the 200 shipped to Minato.
describe("recall spreadsheet from a 2024 harvest lot", () => {
  let rows: Row[];
  beforeAll(async () => {
    rows = await recallRows(harvest2024);
  });

  it("is a CSV download named after the lot, with a byte-order mark", async () => {
    const { response, text } = await download(harvest2024, sales);
    expect(response.headers.get("content-type")).toBe("text/csv; charset=utf-8");
    expect(response.headers.get("content-disposition")).toBe(`attachment; filename="grainline-recall-${harvest2024}.csv"`);
    expect(text.charCodeAt(0)).toBe(0xfeff);
    expect(text.split("\r\n")[0]).toBe("\uFEFF" + COLUMNS.join(","));
  });

  it("starts from the harvest: registered and drawn whole into the polishing run", () => {
    expect(of(rows, harvest2024, "created")).toMatchObject([{ Quantity: "1500", Unit: "kg", Event: "Harvest registered", Product: "Harvest (brown rice), Yamada Nishiki", Date: "2024-09-25T10:00:00.000+09:00", "Share from recalled lot": "1" }]);
    expect(of(rows, harvest2024, "drawn from")).toMatchObject([{ Quantity: "1500", Event: "Polishing run", Location: "Shirotae Polishing Works, Mill Road 5, Asagiri Valley" }]);
    expect(of(rows, harvest2024, "received")).toMatchObject([{ Counterparty: "Ikeda Farm", "Reference document": "DS-2024-01", Location: "Shirotae mill yard", "Recording party": "Shirotae Polishing Works", "Recorded by": "Ota Kenji" }]);
  });

  it("reaches the tank, with every addition and the whole of it drawn at pressing", () => {
    const tank = rows.filter((r) => r.Product.startsWith("Tank (moromi)"));
    const code = tank[0]!["Lot code"];
    expect(of(rows, code!, "created")).toHaveLength(1);
    expect(of(rows, code!, "added to")).toHaveLength(2);
    expect(of(rows, code!).filter((r) => r.Event === "Mash addition")).toHaveLength(3);
    const added = of(rows, code!).filter((r) => r.Entry !== "drawn from").reduce((sum, r) => sum + Number(r.Quantity), 0);
    const pressed = of(rows, code!, "drawn from");
    expect(pressed).toMatchObject([{ Event: "Pressing", Unit: "kg" }]);
    // Nothing else drew on the tank: pressing took what the three additions put in.
    expect(Number(pressed[0]!.Quantity)).toBeCloseTo(added, 6);
  });

  it("reaches the sake, both bottlings and the shipment to Minato Liquor Wholesale", () => {
    const sake = rows.filter((r) => r.Product.startsWith("Pressed sake") && r.Entry === "created");
    expect(sake).toMatchObject([{ Quantity: "1020", Unit: "L", Event: "Pressing", Date: "2025-01-20T09:00:00.000+09:00" }]);
    const bottlings = rows.filter((r) => r.Product.startsWith("Bottled") && r.Entry === "created");
    expect(bottlings.map((r) => [r.Quantity, r.Unit, r.Date])).toEqual([
      ["800", "bottle", "2025-03-02T09:00:00.000+09:00"],
      ["200", "bottle", "2025-03-18T09:00:00.000+09:00"],
    ]);
    // 800 and 200 bottles of 720 mL: 576 L and 144 L drawn from the sake.
    expect(of(rows, sake[0]!["Lot code"]!, "drawn from").map((r) => Number(r.Quantity))).toEqual([576, 144]);
    const shipped = rows.filter((r) => r.Entry === "shipped");
    // The dispatches that preceded each receipt are shipments too (a receipt needs the sender's word).
    expect(shipped).toEqual([
      expect.objectContaining({ "Lot code": harvest2024, Quantity: "1500", Counterparty: "Shirotae Polishing Works", "Reference document": "DS-2024-01", "Recording party": "Ikeda Farm" }),
      expect.objectContaining({ Product: "Polished rice, Yamada Nishiki", Quantity: "1000", Counterparty: "Kirinoha Brewery", "Recording party": "Shirotae Polishing Works" }),
      expect.objectContaining({ "Lot code": bottlings[1]!["Lot code"], Quantity: "200", Unit: "bottle", Event: "Shipped", Counterparty: "Minato Liquor Wholesale", "Reference document": "INV-2025-031", Location: "Kirinoha dispatch", Date: "2025-03-20T14:00:00.000+09:00" }),
    ]);
  });

  it("gives each lot the fraction the forward trace gives it", async () => {
    const reached = (await forward(harvest2024)).reached;
    const fractions = new Map(reached.map((r) => [r.code, r.fraction]));
    expect(new Set(rows.map((r) => r["Lot code"]))).toEqual(new Set([harvest2024, ...fractions.keys()]));
    for (const row of rows) {
      const expected = row["Lot code"] === harvest2024 ? 1 : fractions.get(row["Lot code"])!;
      expect(Number(row["Share from recalled lot"]), row["Lot code"]).toBeCloseTo(expected, 6);
    }
    // By hand: 1500 of the 2000 kg of brown rice in the run (product.md, "Composition").
    expect(Number(rows.find((r) => r.Product.startsWith("Bottled"))!["Share from recalled lot"])).toBeCloseTo(0.75, 9);
  });

  it("is sorted by date, then lot, with every date in ISO 8601 with its offset", () => {
    expect(rows.length).toBeGreaterThan(30);
    for (const row of rows) expect(row.Date).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}\+09:00$/);
    for (let i = 1; i < rows.length; i++) {
      const [a, b] = [rows[i - 1]!, rows[i]!];
      const order = Date.parse(a.Date!) - Date.parse(b.Date!) || a["Lot code"]!.localeCompare(b["Lot code"]!);
      expect(order, `${a.Date} ${a["Lot code"]} before ${b.Date} ${b["Lot code"]}`).toBeLessThanOrEqual(0);
    }
  });
});

describe("corrections in the recall", () => {
  it("shows a reversed polishing run with the reversal and its reason (seeded 2026 season)", async () => {
    const lot = (getSqlite().prepare("select code from lots where kind = 'harvest' and crop_year = 2026 and field_id = 'field-nakase-shrine'").get() as { code: string }).code;
    const fix = getSqlite().prepare("select id, corrects from events where step = 'correcting' and reason like 'Polished weight%'").get() as { id: number; corrects: number };
    const rows = await recallRows(lot);
    const original = of(rows, lot).filter((r) => r.Event === "Polishing run" && r["Reversed by event"] === String(fix.id));
    expect(original).toMatchObject([{ Entry: "drawn from", Quantity: "900", "Event ID": String(fix.corrects) }]);
    expect(rows.filter((r) => r["Reverses event"] === String(fix.corrects))).toMatchObject([
      { "Lot code": lot, Entry: "reversal: returned", Quantity: "900", Event: "Correction", "Reason for reversal": "Polished weight keyed from the wrong scale ticket" },
    ]);
    // Recorded again afterwards: the second run draws the same 900 kg and is not reversed.
    expect(of(rows, lot).filter((r) => r.Event === "Polishing run" && r["Reversed by event"] === "")).toMatchObject([{ Entry: "drawn from", Quantity: "900" }]);
    // The reversed run's polished lot holds nothing from the harvest any more, so it is not reached.
    const wrongOutput = getSqlite().prepare("select l.code from event_outputs o join lots l on l.id = o.lot_id where o.event_id = ? and l.kind = 'polished'").get(fix.corrects) as { code: string };
    expect(of(rows, wrongOutput.code)).toEqual([]);
  });
});

describe("formula injection (OWASP, \"CSV Injection\")", () => {
  it("prefixes cells that start with = + - @ with an apostrophe", async () => {
    const res = await call(postHarvest, jsonRequest("/api/harvests", { cookie: grower, body: { fieldId: "field-ikeda-cedar", variety: "Omachi", cropYear: 2025, brownKg: 300, moisturePct: 14.6, grade: "1", bags: 5, at: "2025-09-20T09:00:00+09:00" } }));
    expect(res.status).toBe(201);
    const code = res.body.code as string;
    await call(postEvent, jsonRequest("/api/events", { cookie: grower, body: { step: "shipping", at: "2025-10-01T07:00:00+09:00", inputs: [{ lot: code, quantity: 300 }], counterpartyId: "mill-shirotae", referenceDoc: "DS-0300" } }));
    const received = await call(postEvent, jsonRequest("/api/events", { cookie: miller, body: { step: "receiving", at: "2025-10-01T10:00:00+09:00", inputs: [{ lot: code, quantity: 300 }], place: "=cmd|' /C calc'!A0", referenceDoc: "@SUM(1+1)", note: "" } }));
    expect(received.status, JSON.stringify(received.body)).toBe(201);
    const rows = await recallRows(code, auditor);
    expect(of(rows, code, "received")).toMatchObject([{ Location: "'=cmd|' /C calc'!A0", "Reference document": "'@SUM(1+1)" }]);
  });
});

describe("who may run a recall", () => {
  it("refuses a grower with 403, even for the grower's own harvest", async () => {
    const { response, text } = await download(harvest2024, grower);
    expect(response.status).toBe(403);
    expect((JSON.parse(text) as { error: { code: string } }).error.code).toBe("forbidden");
  });

  it("answers 404 for a code no lot has, and 401 without a session", async () => {
    const missing = await download("H99-9999", sales);
    expect(missing.response.status).toBe(404);
    expect((await download(harvest2024)).response.status).toBe(401);
  });
});
