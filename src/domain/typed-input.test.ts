import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { parseTypedDate, parseTypedNumber } from "./typed-input";

// Full-width forms are ASCII + 0xFEE0 (Unicode Halfwidth and Fullwidth Forms block, U+FF01–FF5E).
const fullWidth = (s: string) => s.replace(/[0-9,.+\-/]/g, (c) => String.fromCharCode(c.charCodeAt(0) + 0xfee0));

describe("parseTypedNumber", () => {
  // Separators: CLDR number symbols for ja and en (group ",", decimal "."); groups of three: common practice.
  it.each([
    ["1260", 1260],
    ["1,260", 1260],
    ["12,345.6", 12345.6],
    ["1,234,567", 1234567],
    ["１２６０", 1260],
    ["１，２６０", 1260],
    ["１３．５", 13.5],
    ["－５", -5],
    ["−5", -5],
    ["+3.25", 3.25],
    ["　42　", 42],
    [" 0.5 ", 0.5],
    [".5", 0.5],
    ["-0", 0],
    ["007", 7],
  ])("reads %j as %d", (text, value) => {
    expect(parseTypedNumber(text)).toBe(value);
  });

  it.each(["", "   ", "1,26", "12,34,5", "1,2345", ",123", "1,", "1.", "1e3", "0x10", "Infinity", "NaN", "--5", "+-5", "1 260", "1.2.3", "5kg", "１,２６", "1_000"])(
    "refuses %j",
    (text) => {
      expect(parseTypedNumber(text)).toBeNull();
    },
  );

  // Reference: ECMA-402 Intl.NumberFormat (ja-JP, en-US). 21 significant digits always round-trip a double (IEEE 754: 17 suffice).
  const safe = fc.oneof(
    fc.integer({ min: Number.MIN_SAFE_INTEGER, max: Number.MAX_SAFE_INTEGER }),
    fc.double({ min: -Number.MAX_SAFE_INTEGER, max: Number.MAX_SAFE_INTEGER, noNaN: true, noDefaultInfinity: true }),
  );
  for (const locale of ["ja-JP", "en-US"]) {
    it(`reads back what Intl.NumberFormat("${locale}") writes, in ASCII and full width`, () => {
      const format = new Intl.NumberFormat(locale, { maximumSignificantDigits: 21, useGrouping: true });
      fc.assert(
        fc.property(safe, (n) => {
          const text = format.format(n);
          const back = parseTypedNumber(text);
          const wide = parseTypedNumber(fullWidth(text));
          // === treats -0 and 0 alike: the parser gives 0 for "-0" on purpose.
          return back === n && wide === n;
        }),
        { numRuns: 500 },
      );
    });
  }
});

describe("parseTypedDate", () => {
  it.each([
    ["2026/10/03", "2026-10-03"],
    ["2026-10-03", "2026-10-03"],
    ["2026/1/3", "2026-01-03"],
    ["２０２６／１０／０３", "2026-10-03"],
    ["２０２６－１０－０３", "2026-10-03"],
    ["2026年10月3日", "2026-10-03"],
    ["２０２６年１０月３日", "2026-10-03"],
    [" 2026/10/03　", "2026-10-03"],
    // 2028 is a leap year (Gregorian rule: divisible by 4, not by 100 unless by 400).
    ["2028/02/29", "2028-02-29"],
    ["2000/02/29", "2000-02-29"],
  ])("reads %j as %s", (text, day) => {
    expect(parseTypedDate(text)).toBe(day);
  });

  it.each(["", "2026/02/30", "2026/02/29", "1900/02/29", "2026/13/01", "2026/00/10", "2026/10/00", "26/10/03", "10/03/2026", "2026/10-03", "2026.10.03", "2026年10月", "2026-10-03T00:00", "20261003", "0999/01/01"])(
    "refuses %j",
    (text) => {
      expect(parseTypedDate(text)).toBeNull();
    },
  );

  it("agrees with ECMA-262 Date on every day of a span of years", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1000, max: 9999 }), fc.integer({ min: 1, max: 12 }), fc.integer({ min: 1, max: 31 }), (y, m, d) => {
        const real = new Date(Date.UTC(y, m - 1, d)).getUTCDate() === d;
        const parsed = parseTypedDate(`${y}/${m}/${d}`);
        return real ? parsed === new Date(Date.UTC(y, m - 1, d)).toISOString().slice(0, 10) : parsed === null;
      }),
    );
  });
});
