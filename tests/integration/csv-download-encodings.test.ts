import fc from "fast-check";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as postEvent } from "../../app/api/events/route";
import { POST as postHarvest } from "../../app/api/harvests/route";
import { GET as transactionsRoute } from "../../app/api/records/transactions.csv/route";
import { GET as statementRoute } from "../../app/api/suppliers/[partyId]/statements/[number]/statement.csv/route";
import { GET as recallRoute } from "../../app/api/trace/[code]/recall.csv/route";
import { getSqlite } from "@/server/platform/db";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";

type Handler = typeof transactionsRoute;

let admin: string, miller: string, grower: string, harvestLot: string;
const PLACE = "㈱白妙精米所 第①倉庫（髙橋）";
// 𠮷 (U+20BB7) is outside JIS X 0208 and CP932 (WHATWG Encoding Standard, index jis0208 has no entry for it).
const UNFIT_PLACE = "𠮷田倉庫";

const harvest = async (brownKg: number) =>
  (await call(postHarvest, jsonRequest("/api/harvests", { cookie: grower, body: { fieldId: "field-ikeda-terrace", variety: "Yamada Nishiki", cropYear: 2025, brownKg, moisturePct: 14.6, grade: "1", bags: 5, at: "2025-09-20T09:00:00+09:00" } }))).body.code as string;
async function receive(lot: string, kg: number, at: string, place: string) {
  const holder = (getSqlite().prepare("select party_id as p from lots where code = ?").get(lot) as { p: string }).p;
  for (const [cookie, body] of [
    [admin, { step: "shipping", partyId: holder, at: "2025-09-20T10:00:00+09:00", inputs: [{ lot, quantity: kg }], counterpartyId: "mill-shirotae", referenceDoc: `納品書-${lot}` }],
    [miller, { step: "receiving", at, inputs: [{ lot, quantity: kg }], referenceDoc: `納品書-${lot}`, place }],
  ] as const) {
    const res = await call(postEvent, jsonRequest("/api/events", { cookie, body }));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
  }
}

async function download(handler: Handler, url: string, params: Record<string, string> = {}, cookie = admin) {
  const response = await handler(jsonRequest(url, { cookie }), { params: Promise.resolve(params) });
  return { response, bytes: new Uint8Array(await response.arrayBuffer()) };
}
// Node's TextDecoder is the WHATWG Encoding Standard's decoder: independent of iconv-lite, which writes the file.
const utf8 = (bytes: Uint8Array) => new TextDecoder("utf-8", { fatal: true, ignoreBOM: true }).decode(bytes);
const shiftJis = (bytes: Uint8Array) => new TextDecoder("shift_jis", { fatal: true }).decode(bytes);

const OCTOBER = "/api/records/transactions.csv?from=2025-10-01&to=2025-10-31";
const NOVEMBER = "/api/records/transactions.csv?from=2025-11-01&to=2025-11-30";
const DOWNLOADS: [string, Handler, string, Record<string, string>][] = [
  ["transactions", transactionsRoute, OCTOBER, {}],
  ["recall", recallRoute, "/api/trace/P26-0001/recall.csv", { code: "P26-0001" }],
  ["statement", statementRoute, "/api/suppliers/grower-ikeda/statements/S-2025-0001/statement.csv", { partyId: "grower-ikeda", number: "S-2025-0001" }],
];
const withEncoding = (url: string, value: string) => `${url}${url.includes("?") ? "&" : "?"}encoding=${encodeURIComponent(value)}`;

beforeAll(async () => {
  [admin, miller, grower] = [await signInAs("admin@example.com"), await signInAs("miller@example.com"), await signInAs("grower@example.com")];
  harvestLot = await harvest(300);
  await receive(harvestLot, 300, "2025-10-02T10:00:00+09:00", PLACE);
  await receive(await harvest(200), 200, "2025-11-05T10:00:00+09:00", UNFIT_PLACE);
});

describe.each(DOWNLOADS)("GET %s CSV", (_name, handler, url, params) => {
  it("answers UTF-8 starting with the byte-order mark EF BB BF by default, and the same for ?encoding=utf-8", async () => {
    const plain = await download(handler, url, params);
    expect(plain.response.status).toBe(200);
    expect(plain.response.headers.get("content-type")).toBe("text/csv; charset=utf-8");
    expect([...plain.bytes.slice(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
    const asked = await download(handler, withEncoding(url, "utf-8"), params);
    expect(asked.bytes).toEqual(plain.bytes);
  });

  it("answers Shift_JIS that the WHATWG decoder reads back as the UTF-8 file's text, without a BOM", async () => {
    const sjis = await download(handler, withEncoding(url, "shift_jis"), params);
    expect(sjis.response.status).toBe(200);
    expect(sjis.response.headers.get("content-type")).toBe("text/csv; charset=Shift_JIS");
    expect(sjis.response.headers.get("content-disposition")).toMatch(/-sjis\.csv"$/);
    const reference = utf8((await download(handler, url, params)).bytes);
    expect(`\uFEFF${shiftJis(sjis.bytes)}`).toBe(reference);
  });

  it("refuses an encoding it does not offer with 422 on `encoding`", async () => {
    for (const value of ["latin1", "UTF-16", "", "sjis", "utf-8 "]) {
      const res = await call(handler, jsonRequest(withEncoding(url, value), { cookie: admin }), params);
      expect(res.status, value).toBe(422);
      expect(res.body.error.fields.encoding.length).toBe(1);
    }
  });
});

describe("Shift_JIS exports and what CP932 cannot hold", () => {
  it("writes the Japanese place and slip in CP932 (①, ㈱ and 髙 are CP932 extensions)", async () => {
    const text = shiftJis((await download(transactionsRoute, withEncoding(OCTOBER, "shift_jis"))).bytes);
    expect(text).toContain(PLACE);
    expect(text).toContain(`納品書-${harvestLot}`);
  });

  it("answers 422 naming the row, the column and the character, suggests UTF-8, and changes nothing", async () => {
    const before = await tableDigests(["sessions"]);
    const english = { cookie: admin, headers: { "accept-language": "en" } };
    const res = await call(transactionsRoute, jsonRequest(withEncoding(NOVEMBER, "shift_jis"), english));
    expect(res.status).toBe(422);
    // Row 1 is the header; the November receipt is the only record in that month.
    expect(res.body.error.fields.encoding).toEqual(["Row 2, column “Place” holds “𠮷”, which Shift_JIS cannot hold. Download the UTF-8 file instead."]);
    // In Japanese it names the column as the Japanese file's header does.
    const ja = await call(transactionsRoute, jsonRequest(withEncoding(NOVEMBER, "shift_jis"), { cookie: admin, headers: { "accept-language": "ja" } }));
    expect(ja.body.error.fields.encoding[0]).toMatch(/^2 行目の「.+」列の値「𠮷」/);
    expect(await tableDigests(["sessions"])).toEqual(before);
    // The UTF-8 file holds it.
    expect(utf8((await download(transactionsRoute, NOVEMBER)).bytes)).toContain(UNFIT_PLACE);
  });

  it("checks who asks before what is asked: signed out, a bad encoding is still 401", async () => {
    const res = await call(recallRoute, jsonRequest(withEncoding("/api/trace/P26-0001/recall.csv", "latin1")), { code: "P26-0001" });
    expect(res.status).toBe(401);
  });

  it("answers any other encoding value with 422, never a 5xx (fast-check)", async () => {
    await fc.assert(
      fc.asyncProperty(fc.string({ unit: "binary", maxLength: 24 }).filter((s) => s !== "utf-8" && s !== "shift_jis"), async (value) => {
        const res = await call(transactionsRoute, jsonRequest(withEncoding(OCTOBER, value), { cookie: admin }));
        expect(res.status).toBe(422);
      }),
      { seed: 20_261_203, numRuns: 40 },
    );
  });
});
