import { describe, expect, it } from "vitest";
import { GET as sheetRoute } from "../../app/api/provenance/[code]/sheet.pdf/route";
import { getSqlite } from "@/server/platform/db";
import { translator } from "@/i18n/messages";
import type { Translate } from "@/lib/validation/field-errors";
import { provenanceSheetPdf } from "@/server/trace/provenance-sheet";
import { provenanceFor, publicProvenance } from "@/server/trace/provenance";
import { call, jsonRequest, signInAs } from "../support/api";
import { readPdfText } from "../support/pdf-read";

const sales = { id: "user-sales", role: "sales" as const, partyId: "brewery-kirinoha", email: "", name: "" };
const code = (sql: string) => (getSqlite().prepare(sql).get() as { code: string }).code;

// The seeded blend bottling (GTIN 9506000134376): 400 L of Tank 2 sake + 600 L of Tank 3 sake.
// Tank 2 and Tank 3 rice both come from the 60 % polished lot: 500 kg Yamada Nishiki brown rice
// from the co-op (Okayama) + 1,800 kg Omachi from the Nakase paddies (Hyogo), by brown weight.
describe("provenance answer", () => {
  it("names varieties, origins by weight, and only growers who agreed to be named", () => {
    const bottled = code("select code from lots where kind = 'bottled' and json_extract(attributes, '$.gtin') = '9506000134376'");
    const p = provenanceFor(sales, bottled);
    expect(p.varieties.map((v) => v.name)).toEqual(["Omachi", "Yamada Nishiki"]);
    expect(p.varieties[0]!.share).toBeCloseTo(1800 / 2300, 9);
    expect(p.originStatement).toBe("Hyogo, Okayama");
    // Nakase Family Paddies did not agree to be named; the co-op did.
    expect(p.growers).toEqual([
      { name: null, share: expect.closeTo(1800 / 2300, 9) },
      { name: "Upper Asagiri Growers' Cooperative", share: expect.closeTo(500 / 2300, 9) },
    ]);
    expect(p.polishingRatiosPct).toEqual([60]);
    expect(p.bottledOn).toHaveLength(1);
    // One brew date per tank (its first addition) and one pressing each.
    expect(p.brewedOn).toHaveLength(2);
    expect(p.pressedOn).toHaveLength(2);
  });

  it("answers the public page only for a bottling whose GTIN matches", () => {
    const bottled = code("select code from lots where kind = 'bottled' and json_extract(attributes, '$.gtin') = '9506000134352' order by id limit 1");
    const found = publicProvenance("09506000134352", bottled);
    expect(found.provenance.categories).toContain("junmai daiginjo");
    expect(() => publicProvenance("09506000134369", bottled)).toThrow(/not found/);
    expect(() => publicProvenance("09506000134352", "P26-0001")).toThrow(/not found/);
  });

  it("downloads a provenance sheet as PDF for sales; a grower may not", async () => {
    const bottled = code("select code from lots where kind = 'bottled' order by id limit 1");
    const res = await sheetRoute(jsonRequest(`/api/provenance/${bottled}/sheet.pdf`, { cookie: await signInAs("sales@example.com") }), { params: Promise.resolve({ code: bottled }) });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/pdf");
    const bytes = Buffer.from(await res.arrayBuffer());
    expect(bytes.subarray(0, 5).toString()).toBe("%PDF-");
    const grower = await call(sheetRoute, jsonRequest(`/api/provenance/${bottled}/sheet.pdf`, { cookie: await signInAs("grower@example.com") }), { code: bottled });
    expect(grower.status).toBe(403);
  });

  it("the sheet says what the answer card says, in the catalogue's words", async () => {
    // The seeded blend bottling above: 1,800 of 2,300 kg Omachi (78.3 %), 500 kg Yamada Nishiki (21.7 %).
    const bottled = code("select code from lots where kind = 'bottled' and json_extract(attributes, '$.gtin') = '9506000134376'");
    const res = await sheetRoute(jsonRequest(`/api/provenance/${bottled}/sheet.pdf`, { cookie: await signInAs("sales@example.com") }), { params: Promise.resolve({ code: bottled }) });
    const text = (await readPdfText(new Uint8Array(await res.arrayBuffer()))).split("\n").join(" ");
    expect(text).toContain(`Provenance of ${bottled}`);
    expect(text).toContain("Varieties Omachi 78.3 %, Yamada Nishiki 21.7 %");
    expect(text).toContain("Rice origin Hyogo, Okayama");
    expect(text).toContain("Growers who asked not to be named 78.3 %");
    expect(text).toContain("Polishing ratio 60 %");
    // The smaller koji share of the two tanks, as a number.
    expect(text).toMatch(/Koji rice \d+(\.\d)? % of the rice \(dry basis\)/);
    expect(text).not.toContain("NaN");
    expect(text).toContain("Recall and labelling decisions follow");
  });

  it("a house blend's hundreds of brew days read as the first and last and how many, in both languages", async () => {
    const bottled = code("select code from lots where kind = 'bottled' and json_extract(attributes, '$.gtin') = '9506000134376'");
    // Twelve tanks begun at 09:00 Tokyo time (00:00 UTC) on 1–12 October, one more on 1 October.
    const brewedOn = Array.from({ length: 12 }, (_, n) => new Date(Date.UTC(2026, 9, n + 1)).toISOString());
    const p = { ...provenanceFor(sales, bottled), brewedOn: [...brewedOn, "2026-10-01T05:00:00.000Z"] };
    const sheet = async (locale: "en" | "ja") => {
      const t = translator(locale);
      const pdf = await provenanceSheetPdf(p, "Kirinoha", { t: ((key, values) => t(key as never, values as never)) as Translate, locale, timeZone: "Asia/Tokyo" });
      return (await readPdfText(pdf)).split("\n").join(" ");
    };
    expect(await sheet("en")).toContain("Brewed 12 days, Oct 1, 2026 to Oct 12, 2026");
    expect((await sheet("ja")).replace(/\s+/g, "")).toContain("仕込日2026/10/01〜2026/10/12の12日");
  });
});
