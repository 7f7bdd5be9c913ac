import { beforeAll, describe, expect, it } from "vitest";
import { GET as sheetRoute } from "../../app/api/provenance/[code]/sheet.pdf/route";
import { POST as postAdjustment } from "../../app/api/suppliers/[partyId]/adjustments/route";
import { GET as getStatementPdf } from "../../app/api/suppliers/[partyId]/statements/[number]/statement.pdf/route";
import { POST as postStatement } from "../../app/api/suppliers/[partyId]/statements/route";
import { taxByRate } from "@/domain/tax";
import { translator } from "@/i18n/messages";
import { getSqlite } from "@/server/platform/db";
import { provenanceFor } from "@/server/trace/provenance";
import { provenanceSheetPdf } from "@/server/trace/provenance-sheet";
import { call, jsonRequest, signInAs } from "../support/api";
import { readPdfText } from "../support/pdf-read";

const ja = translator("ja");
const JA = { "accept-language": "ja-JP,ja;q=0.9" };
const DAY = "2026-08-17";
const sales = { id: "user-sales", role: "sales" as const, partyId: "brewery-kirinoha", email: "", name: "" };
let admin: string;
beforeAll(async () => {
  admin = await signInAs("admin@example.com");
});

/** Adjustments on a day no other entry falls on, then a statement of that day; its PDF as the admin reads it in Japanese. */
async function statementOf(partyId: string, lines: { amountYen: number; taxRatePct: number; reason: string }[]) {
  for (const line of lines) {
    const res = await call(postAdjustment, jsonRequest(`/api/suppliers/${partyId}/adjustments`, { cookie: admin, body: { date: DAY, ...line } }), { partyId });
    expect(res.status).toBe(201);
  }
  const issued = await call(postStatement, jsonRequest(`/api/suppliers/${partyId}/statements`, { cookie: admin, body: { from: DAY, to: DAY } }), { partyId });
  expect(issued.status).toBe(201);
  const number = issued.body.number as string;
  const pdf = await getStatementPdf(jsonRequest(`/api/suppliers/${partyId}/statements/${number}/statement.pdf`, { cookie: admin, headers: JA }), { params: Promise.resolve({ partyId, number }) });
  expect(pdf.status).toBe(200);
  const bytes = new Uint8Array(await pdf.arrayBuffer());
  return { issued: issued.body, bytes, text: await readPdfText(bytes) };
}

// The qualified invoice system's buyer-made statement (仕入明細書, 適格請求書等保存方式; NTA guidance —
// from memory): the maker, the supplier and its registration number, dates, what was supplied with
// reduced-rate items marked, net and tax per rate, and the supplier's confirmation. Text read by pdf.js.
describe("a statement in Japanese", () => {
  it("carries the supplier's registration number, ※ on reduced-rate lines, totals by rate and the request to confirm", async () => {
    const lines = [
      { amountYen: 123_457, taxRatePct: 8, reason: "米の追加納品（10袋）" },
      { amountYen: 45_679, taxRatePct: 10, reason: "精米の追加作業" },
      { amountYen: 1_111, taxRatePct: 8, reason: "袋数の訂正" },
    ];
    const { issued, text, bytes } = await statementOf("grower-coop", lines);
    // The face is 4.5 MB a weight; subset, the statement carries only the glyphs it draws.
    expect(bytes.length).toBeLessThan(150_000);
    // By hand, rounding down (the default): 8 %: 123,457 + 1,111 = 124,568; × 0.08 = 9,965.44 → 9,965.
    // 10 %: 45,679 × 0.10 = 4,567.9 → 4,567. Gross 124,568 + 9,965 + 45,679 + 4,567 = 184,779.
    expect(taxByRate(lines, "down").rates).toEqual([
      { ratePct: 8, netYen: 124_568, taxYen: 9_965, grossYen: 134_533 },
      { ratePct: 10, netYen: 45_679, taxYen: 4_567, grossYen: 50_246 },
    ]);
    expect(issued.totals.rates).toEqual(taxByRate(lines, "down").rates);
    expect(text).toContain(ja("suppliers.statement.title", { number: issued.number }));
    expect(text).toContain("登録番号");
    expect(text).toMatch(/T0000000000303/);
    expect(text).toContain("Upper Asagiri Growers' Cooperative");
    expect(text).toContain("Kirinoha Brewery");
    // The reduced-rate lines end in ※; the standard-rate line does not.
    expect(text).toMatch(/米の追加納品（10袋）.*※/);
    expect(text).toMatch(/袋数の訂正.*※/);
    expect(text).not.toMatch(/精米の追加作業.*※/);
    expect(text).toContain("※は軽減税率対象");
    // Each rate's net and tax, as the statement's labels say them, with the amount on the next line.
    const amount = (v: string) => ja("suppliers.statement.amount", { amount: v });
    const after = (label: string, value: string) => expect(text).toContain(`${label}\n${amount(value)}`);
    after(ja("suppliers.statement.subtotal", { rate: 8, mark: "※" }), "124,568");
    after(ja("suppliers.statement.tax", { rate: 8 }), "9,965");
    after(ja("suppliers.statement.subtotal", { rate: 10, mark: "" }), "45,679");
    after(ja("suppliers.statement.tax", { rate: 10 }), "4,567");
    after(ja("suppliers.statement.totalInclTax"), "184,779");
    expect(text).toMatch(/8 ?%/);
    expect(text).toMatch(/10 ?%/);
    // A buyer-made statement stands as the invoice only once the supplier confirms it: the request to confirm (確認).
    // Notes wider than the page are wrapped: their rows joined give the sentence back.
    expect(text.replaceAll("\n", "")).toContain(ja("suppliers.statement.checkNote"));
    expect(ja("suppliers.statement.checkNote")).toContain("確認");
    // The transaction day as Japanese writes it: year first, 2026/08/17.
    expect(text).toContain("2026/08/17");
  });

  it("says a supplier without a registration number has none and that the statement is not a qualified invoice", async () => {
    const { text } = await statementOf("grower-nakase", [{ amountYen: 50_000, taxRatePct: 8, reason: "米の追加納品" }]);
    // The registration number's line says there is none (なし), and a note says it is no qualified invoice.
    expect(text).toMatch(/登録番号\nなし/);
    expect(text.replaceAll("\n", "")).toContain(ja("suppliers.statement.notQualifiedNote"));
    expect(ja("suppliers.statement.notQualifiedNote")).toContain("適格請求書");
    expect(text).not.toMatch(/T\d{13}/);
  });
});

describe("the statement e-mail", () => {
  it("goes in Japanese to a supplier whose users chose no language, whatever the office reads", async () => {
    const partyId = "grower-ikeda";
    const res = await call(postAdjustment, jsonRequest(`/api/suppliers/${partyId}/adjustments`, { cookie: admin, body: { date: "2026-08-18", amountYen: 10_000, taxRatePct: 8, reason: "米の追加納品" } }), { partyId });
    expect(res.status).toBe(201);
    // The office issues it from an English screen.
    const issued = await call(postStatement, jsonRequest(`/api/suppliers/${partyId}/statements`, { cookie: admin, body: { from: "2026-08-18", to: "2026-08-18", email: true } }), { partyId });
    expect(issued.status).toBe(201);
    const mail = getSqlite().prepare("select subject from outbox order by created_at desc, rowid desc limit 1").get() as { subject: string };
    expect(mail.subject).toBe(ja("suppliers.mail.subject", { number: issued.body.number, issuer: "Kirinoha Brewery" }));
    expect(mail.subject).toContain("仕入明細書");
  });
});

describe("the provenance sheet in Japanese", () => {
  const bottled = () => (getSqlite().prepare("select code from lots where kind = 'bottled' and json_extract(attributes, '$.gtin') = '9506000134376'").get() as { code: string }).code;

  it("has 精米歩合 and the origin statement in kanji, downloaded in the reader's language", async () => {
    const code = bottled();
    const res = await sheetRoute(jsonRequest(`/api/provenance/${code}/sheet.pdf`, { cookie: await signInAs("sales@example.com"), headers: JA }), { params: Promise.resolve({ code }) });
    expect(res.status).toBe(200);
    const text = await readPdfText(new Uint8Array(await res.arrayBuffer()));
    expect(text).toContain(ja("provenance.sheetTitle", { code }));
    expect(text).toContain("精米歩合");
    // 1,800 kg from Hyogo, 500 kg from Okayama (the seed's blend): Hyogo first.
    expect(text).toContain("兵庫県産、岡山県産");
  });

  it("prints a bottling at 07:30 in Tokyo on that Tokyo day, not the UTC day before", async () => {
    const answer = provenanceFor(sales, bottled());
    // 22:30 UTC on 2 October is 07:30 on 3 October in Tokyo (JST is UTC+9 with no DST, IANA tz database).
    const bytes = await provenanceSheetPdf({ ...answer, bottledOn: ["2026-10-02T22:30:00.000Z"] }, "Kirinoha Brewery", { t: (k, v) => ja(k as never, v as never), locale: "ja", timeZone: "Asia/Tokyo" });
    const text = await readPdfText(bytes);
    expect(text).toContain(`${ja("provenance.bottledOn")}\n2026/10/03`);
    expect(text).not.toContain("2026/10/02");
  });
});
