import { readFileSync } from "node:fs";
import path from "node:path";
import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { decodeCsvBytes } from "./csv-encoding";

// The fixtures were written by Debian's iconv (glibc 2.36), not by this project (fixtures/README.md).
const fixture = (name: string) => new Uint8Array(readFileSync(path.resolve("fixtures/csv", name)));
const cells = (text: string) => Papa.parse<string[]>(text, { skipEmptyLines: true }).data;

describe("decodeCsvBytes", () => {
  it("reads a CP932 file from iconv, its NEC (①, ㈱) and IBM (髙) extensions included", () => {
    const decoded = decodeCsvBytes(fixture("receipts-shift-jis.csv"));
    expect(decoded).toMatchObject({ ok: true, encoding: "Shift_JIS" });
    if (!decoded.ok) return;
    const rows = cells(decoded.text);
    expect(rows[1]).toEqual(["H26-0001", "生産者 池田農園", "600", "2026-10-02", "納品書①", "㈱白妙精米所 第①倉庫"]);
    // CP932 0x8160 is U+FF5E FULLWIDTH TILDE (WHATWG index jis0208), not JIS X 0208's WAVE DASH.
    expect(rows[2]).toEqual(["H26-0002", "生産者 髙橋さんの圃場", "1,260", "2026/10/03", "納品書②", "精米所 朝霧谷 ～ 受入場"]);
  });

  it("reads UTF-8 with a byte-order mark as the same text, the mark left out", () => {
    const withBom = decodeCsvBytes(fixture("receipts-utf8-bom.csv"));
    const sjis = decodeCsvBytes(fixture("receipts-shift-jis.csv"));
    expect(withBom).toMatchObject({ ok: true, encoding: "UTF-8" });
    expect(withBom.ok && sjis.ok && withBom.text === sjis.text).toBe(true);
    expect(withBom.ok && withBom.text.startsWith("lot,from,")).toBe(true);
  });

  it("reads a plain ASCII file as UTF-8 (ASCII is a subset of both; RFC 3629)", () => {
    const bytes = fixture("receipts-good.csv");
    expect(decodeCsvBytes(bytes)).toEqual({ ok: true, encoding: "UTF-8", text: readFileSync(path.resolve("fixtures/csv/receipts-good.csv"), "utf8") });
  });

  it("refuses ISO-8859-1 text: é (0xE9) is neither UTF-8 nor a Shift_JIS lead byte followed by a trail byte", () => {
    expect(decodeCsvBytes(fixture("receipts-latin1.csv"))).toEqual({ ok: false, reason: "undecodable" });
  });

  it("refuses random bytes", () => {
    expect(decodeCsvBytes(fixture("random-bytes.csv"))).toEqual({ ok: false, reason: "undecodable" });
  });

  it("refuses a BOM followed by bytes that are not UTF-8, rather than guessing Shift_JIS", () => {
    const bytes = new Uint8Array([0xef, 0xbb, 0xbf, 0x61, 0x2c, 0x82, 0xa0, 0x0a]);
    expect(decodeCsvBytes(bytes)).toEqual({ ok: false, reason: "undecodable" });
  });

  it("refuses text holding U+FFFD or a control character, naming the line", () => {
    const encode = (s: string) => new TextEncoder().encode(s);
    expect(decodeCsvBytes(encode("a,b\nc,\uFFFD\n"))).toEqual({ ok: false, reason: "replacement", line: 2 });
    expect(decodeCsvBytes(encode("a,b\r\nc,d\r\ne,\u0000\r\n"))).toEqual({ ok: false, reason: "control", line: 3 });
    expect(decodeCsvBytes(encode("a,b\nc,\u0085\n"))).toEqual({ ok: false, reason: "control", line: 2 });
    // TAB, CR and LF are a CSV's own (RFC 4180 line breaks; tabs within cells).
    expect(decodeCsvBytes(encode("a,b\r\nc\t1,d\n"))).toMatchObject({ ok: true });
  });
});
