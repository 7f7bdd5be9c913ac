import iconv from "iconv-lite";
import { describe, expect, it } from "vitest";
import { encodeShiftJis, firstMisfitCell, fitsShiftJis } from "./shift-jis";

// Checked against iconv-lite's cp932 table (Microsoft's Windows-31J), which this file does not use.
const SAMPLE = "生産者 池田農園,㈱白妙精米所 第①倉庫（髙橋）,精米歩合 60 %,～,ｱｲｳ,ⅰⅱ,￢∵,a\\b~\r\n";

describe("encodeShiftJis", () => {
  it("writes the same bytes as iconv-lite's CP932 for names, NEC and IBM extensions, half-width kana and ASCII", () => {
    expect(Buffer.from(encodeShiftJis(SAMPLE)!)).toEqual(iconv.encode(SAMPLE, "cp932"));
  });

  it("writes what the WHATWG decoder reads back as the same text", () => {
    expect(new TextDecoder("shift_jis", { fatal: true }).decode(encodeShiftJis(SAMPLE)!)).toBe(SAMPLE);
  });

  it("has no code for 𠮷, an emoji, WAVE DASH 〜 (CP932 writes ～ FULLWIDTH TILDE) or ¥ (0x5C reads back as \\)", () => {
    for (const ch of ["𠮷", "😀", "〜", "¥"]) {
      expect(encodeShiftJis(`a${ch}`), ch).toBeNull();
      expect(fitsShiftJis(ch), ch).toBe(false);
    }
  });
});

describe("firstMisfitCell", () => {
  it("names the row as a spreadsheet numbers it, the column by its header, and the character", () => {
    const csv = "\uFEFFDate,Place\r\n2026-10-02,精米所\r\n2026-10-03,\"𠮷田\r\n倉庫\"\r\n";
    expect(firstMisfitCell(csv, fitsShiftJis)).toEqual({ row: 3, column: "Place", value: "𠮷" });
    expect(firstMisfitCell("Date,Place\r\n2026-10-02,精米所\r\n", fitsShiftJis)).toBeNull();
  });
});
