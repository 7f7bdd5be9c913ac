// The supplier account's list is written as CSV by the server (GET /api/suppliers/{partyId}/list.csv)
// instead of being handed to the browser with every page. The file must be the one the browser
// tables wrote: tanstack's CSV of their old columns (tests/integration/old-table-csv.ts), every row
// of the view, the same header line; and Shift_JIS on request.
import Papa from "papaparse";
import { beforeAll, describe, expect, it } from "vitest";
import { csvText } from "@/lib/validation/csv";
import { deliveriesOf, runsOf } from "@/server/suppliers/supplier-portal";
import { listHeaders } from "@/components/supplier-lists/account-list-view";
import { DELIVERY_COLUMNS, isUnpriced } from "@/components/supplier-lists/deliveries-view";
import { isUnpricedRun, RUN_COLUMNS } from "@/components/supplier-lists/runs-view";
import { translator } from "@/i18n/messages";
import { GET } from "../../app/api/suppliers/[partyId]/list.csv/route";
import { jsonRequest, signInAs } from "../support/api";
import { oldDeliveryColumns, oldRunColumns, oldTableCsv } from "./old-table-csv";

let admin = "";
beforeAll(async () => {
  admin = await signInAs("admin@example.com");
});

async function download(partyId: string, query = "") {
  const response = await GET(jsonRequest(`/api/suppliers/${partyId}/list.csv${query}`, { cookie: admin }), { params: Promise.resolve({ partyId }) });
  return { status: response.status, type: response.headers.get("content-type"), disposition: response.headers.get("content-disposition") ?? "", bytes: new Uint8Array(await response.arrayBuffer()) };
}
const english = (key: string) => translator("en")(key as never);
const utf8 = (bytes: Uint8Array) => new TextDecoder("utf-8", { ignoreBOM: true }).decode(bytes);
const headerLine = (text: string) => Papa.parse<string[]>(text.replace(/^\uFEFF/, "")).data[0]!;

describe("the supplier account's list as CSV", () => {
  it("writes a grower's deliveries as the browser table did, all or only the unpriced", async () => {
    for (const [query, keep] of [["", () => true], ["?unpriced=1", isUnpriced]] as const) {
      const file = await download("grower-ikeda", query);
      expect(file.status).toBe(200);
      expect(file.disposition).toContain("grainline-deliveries.csv");
      const text = utf8(file.bytes);
      const old = oldTableCsv(deliveriesOf("grower-ikeda").filter(keep), oldDeliveryColumns);
      if (!query) expect(old.rows.length, "the seeded grower has deliveries").toBeGreaterThan(0);
      expect(text).toBe(csvText(headerLine(text), old.rows));
      // The header line is the table's: the same columns, as the page shows them in English.
      expect(headerLine(text)).toEqual(listHeaders(DELIVERY_COLUMNS, (key) => english(`suppliers.${key}`)));
      expect(headerLine(text)).toHaveLength(oldDeliveryColumns.length);
    }
  });

  it("writes a mill's polishing runs as the browser table did", async () => {
    const mill = "mill-shirotae";
    const file = await download(mill);
    expect(file.disposition).toContain("grainline-runs.csv");
    const text = utf8(file.bytes);
    const old = oldTableCsv(runsOf(mill), oldRunColumns);
    expect(old.rows.length).toBeGreaterThan(0);
    expect(text).toBe(csvText(headerLine(text), old.rows));
    expect(headerLine(text)).toEqual(listHeaders(RUN_COLUMNS, (key) => english(`suppliers.${key}`)));
    expect(headerLine(text)).toHaveLength(oldRunColumns.length);
    const unpriced = utf8((await download(mill, "?unpriced=1")).bytes);
    expect(unpriced).toBe(csvText(headerLine(text), oldTableCsv(runsOf(mill).filter(isUnpricedRun), oldRunColumns).rows));
  });

  it("gives Shift_JIS when asked, and refuses an encoding it does not know", async () => {
    const sjis = await download("grower-ikeda", "?encoding=shift_jis");
    expect(sjis.type).toContain("Shift_JIS");
    expect(sjis.disposition).toContain("grainline-deliveries-sjis.csv");
    expect(new TextDecoder("shift_jis").decode(sjis.bytes)).toBe(utf8((await download("grower-ikeda")).bytes).replace(/^\uFEFF/, ""));
    expect((await download("grower-ikeda", "?encoding=latin9")).status).toBe(422);
  });
});
