import { PDFDocument, StandardFonts } from "pdf-lib";
import { beforeAll, describe, expect, it } from "vitest";
import { embedDocumentFonts, type DocumentFonts } from "./pdf-fonts";
import { breakUnits, wrapText } from "./pdf-text";

// W3C "Requirements for Japanese Text Layout" (JLREQ) §3.1.7 and Appendix A (after JIS X 4051):
// closing brackets (cl-02), hyphens (cl-03 subset), dividing punctuation (cl-04), middle dots
// (cl-05), full stops (cl-06), commas (cl-07), iteration marks (cl-09), the prolonged sound mark
// and small kana (cl-10/cl-11) may not start a line; opening brackets (cl-01) may not end one.
const NO_LINE_START = [..."、。，．・：；？！ー）」』】〕〉》ゃゅょっぁぃぅぇぉャュョッァィゥェォ々ゝゞ"];
const NO_LINE_END = [..."（「『【〔〈《"];

const SENTENCE =
  "この仕入明細書（2026年10月分）の記載内容をご確認のうえ、相違がある場合は「受入」の記録をお確かめください。" +
  "精米歩合は60 %、原料米は新潟県産・兵庫県産です。ロットごとの重量は、出荷時と受入時の双方で計量しています。";

let fonts: DocumentFonts;
beforeAll(async () => {
  fonts = await embedDocumentFonts(await PDFDocument.create());
});

describe("line breaking for Japanese (JLREQ §3.1.7 kinsoku)", () => {
  for (const width of [90, 137, 200, 333]) {
    it(`wraps a long sentence within ${width} pt, no row starting or ending where JLREQ forbids, losing nothing`, () => {
      const rows = wrapText(SENTENCE, fonts.regular, 10, width);
      expect(rows.length).toBeGreaterThan(2);
      for (const row of rows) expect(fonts.regular.widthOfTextAtSize(row, 10)).toBeLessThanOrEqual(width);
      for (const row of rows.slice(1)) expect(NO_LINE_START).not.toContain([...row][0]);
      for (const row of rows.slice(0, -1)) expect(NO_LINE_END).not.toContain([...row].at(-1));
      expect(rows.join("")).toBe(SENTENCE);
    });
  }

  it("keeps small kana, the prolonged sound mark and closing brackets with what they follow", () => {
    const units = breakUnits("ショッピング「チェック」、ちょっと。");
    for (const unit of units.slice(1)) expect(NO_LINE_START).not.toContain([...unit][0]);
    for (const unit of units) expect(NO_LINE_END).not.toContain([...unit].at(-1));
    expect(units.join("")).toBe("ショッピング「チェック」、ちょっと。");
  });

  it("breaks a Japanese run wider than the line by characters", () => {
    const run = "精米歩合".repeat(12);
    const rows = wrapText(run, fonts.regular, 10, 60);
    for (const row of rows) expect(fonts.regular.widthOfTextAtSize(row, 10)).toBeLessThanOrEqual(60);
    expect(rows.join("")).toBe(run);
  });
});

describe("line breaking for English (unchanged: whole words at spaces)", () => {
  const text = "Consumption tax is computed once per rate on this statement's total for that rate; fractions of a yen are rounded down.";

  it("breaks only at spaces, drops the space at the break, and fits the width", async () => {
    const helvetica = await (await PDFDocument.create()).embedFont(StandardFonts.Helvetica);
    for (const font of [fonts.regular, helvetica]) {
      const rows = wrapText(text, font, 9, 180);
      expect(rows.length).toBeGreaterThan(1);
      for (const row of rows) {
        expect(font.widthOfTextAtSize(row, 9)).toBeLessThanOrEqual(180);
        expect(row).toBe(row.trim());
      }
      expect(rows.join(" ")).toBe(text);
    }
  });

  it("does not break inside a word or before a comma", () => {
    expect(breakUnits("Yamada Nishiki, Omachi (Okayama)")).toEqual(["Yamada ", "Nishiki, ", "Omachi ", "(Okayama)"]);
  });

  it("cuts a word wider than the line by characters", () => {
    const rows = wrapText("T1234567890123T1234567890123", fonts.regular, 10, 50);
    expect(rows.length).toBeGreaterThan(1);
    expect(rows.join("")).toBe("T1234567890123T1234567890123");
  });
});
