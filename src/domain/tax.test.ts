import { describe, expect, it } from "vitest";
import { TAX_RATES, taxByRate, taxOnSum } from "./tax";

// Source of the rules: National Tax Agency (NTA), Q&A on the qualified invoice system
// (インボイス制度に関するQ&A, 適格請求書等保存方式) — from memory, corroborated by a secondary
// summary (ark-outsourcing.com, "Preparation for the Invoice System Part 2", 2022): tax is
// rounded ONCE per tax rate per invoice, never line by line, and the issuer may choose the
// method (down, up, half-up). Rates: 10 % standard, 8 % reduced on food such as rice (NTA).
describe("consumption tax per rate, once per statement", () => {
  it("uses 8 % for rice and 10 % for services such as polishing", () => {
    expect(TAX_RATES).toEqual({ reduced: 8, standard: 10 });
  });

  it("reproduces the shape of the NTA's sample invoice: 20,000 yen at each rate → 2,000 + 1,600 tax, 43,600 in all", () => {
    // NTA leaflet sample (figures from memory): 10 % items 22,000 (tax 2,000), 8 % items 21,600 (tax 1,600).
    const s = taxByRate([{ amountYen: 5_000, taxRatePct: 8 }, { amountYen: 15_000, taxRatePct: 8 }, { amountYen: 2_000, taxRatePct: 10 }, { amountYen: 18_000, taxRatePct: 10 }], "down");
    expect(s.rates).toEqual([
      { ratePct: 8, netYen: 20_000, taxYen: 1_600, grossYen: 21_600 },
      { ratePct: 10, netYen: 20_000, taxYen: 2_000, grossYen: 22_000 },
    ]);
    expect(s).toMatchObject({ netYen: 40_000, taxYen: 3_600, grossYen: 43_600 });
  });

  it("sums before it rounds: three rice lines of 1,234 + 2,345 + 999 yen carry 366 yen of tax, not 364", () => {
    const lines = [1_234, 2_345, 999].map((amountYen) => ({ amountYen, taxRatePct: 8 }));
    // Per rate: 4,578 × 8 % = 366.24 → 366. Line by line (not allowed): 98.72 + 187.6 + 79.92 → 98 + 187 + 79 = 364.
    expect(taxByRate(lines, "down").taxYen).toBe(366);
    const perLine = lines.reduce((a, l) => a + taxOnSum(l.amountYen, 8, "down"), 0);
    expect(perLine).toBe(364);
  });

  it("applies the chosen rounding to each rate's sum: rice 1,215,713 yen and polishing 55,556 yen", () => {
    const lines = [{ amountYen: 553_500, taxRatePct: 8 }, { amountYen: 425_213, taxRatePct: 8 }, { amountYen: 237_000, taxRatePct: 8 }, { amountYen: 55_556, taxRatePct: 10 }];
    // 8 %: 1,215,713 × 0.08 = 97,257.04; 10 %: 55,556 × 0.10 = 5,555.6.
    expect(taxByRate(lines, "down").rates.map((r) => r.taxYen)).toEqual([97_257, 5_555]);
    expect(taxByRate(lines, "half-up").rates.map((r) => r.taxYen)).toEqual([97_257, 5_556]);
    expect(taxByRate(lines, "up").rates.map((r) => r.taxYen)).toEqual([97_258, 5_556]);
    expect(taxByRate(lines, "down").grossYen).toBe(1_215_713 + 55_556 + 97_257 + 5_555);
  });

  it("mirrors a reversal exactly and leaves rate-0 lines (payments) out", () => {
    expect(taxOnSum(-1_215_713, 8, "down")).toBe(-97_257);
    const s = taxByRate([{ amountYen: 100_000, taxRatePct: 8 }, { amountYen: -100_000, taxRatePct: 8 }, { amountYen: -50_000, taxRatePct: 0 }], "down");
    expect(s).toEqual({ rates: [{ ratePct: 8, netYen: 0, taxYen: 0, grossYen: 0 }], netYen: 0, taxYen: 0, grossYen: 0 });
  });

  it("refuses a rate the law does not have", () => {
    expect(() => taxByRate([{ amountYen: 100, taxRatePct: 5 }], "down")).toThrow(RangeError);
  });
});
