import { divideRounded, sumYen, type Rounding } from "./money";

/**
 * Consumption tax in Japan since 1 October 2019: the standard rate 10 %, the reduced rate
 * 8 % on food and drink other than alcoholic beverages (rice is food; polishing is a service
 * and takes the standard rate). Source: National Tax Agency (NTA), guidance on the reduced
 * tax rate system — from memory.
 */
export const TAX_RATES = { reduced: 8, standard: 10 } as const;
export const TAXABLE_RATES = [TAX_RATES.reduced, TAX_RATES.standard] as const;
/** 0 marks an entry outside the tax computation (a payment, an adjustment stated gross). */
export const ENTRY_RATES = [0, ...TAXABLE_RATES] as const;
export type EntryRatePct = (typeof ENTRY_RATES)[number];

/**
 * The rounding the brewery uses by default: fractions of a yen dropped. Dropping them is
 * common practice; the qualified invoice system lets the issuer choose the method (down, up,
 * half-up) but allows only ONE rounding per tax rate per invoice — never per line. Source:
 * NTA, Q&A on the qualified invoice system (インボイス制度に関するQ&A, 適格請求書等保存方式),
 * the question on rounding consumption tax — from memory.
 */
export const DEFAULT_TAX_ROUNDING: Rounding = "down";

export type TaxLine = { amountYen: number; taxRatePct: number };
export type RateTotal = { ratePct: number; netYen: number; taxYen: number; grossYen: number };
export type TaxSummary = { rates: RateTotal[]; netYen: number; taxYen: number; grossYen: number };

/** Tax on one rate's sum: the sum times the rate, rounded once. */
export function taxOnSum(netYen: number, ratePct: number, rounding: Rounding): number {
  return divideRounded(netYen * ratePct, 100, rounding);
}

/**
 * A statement's tax: the amounts are summed per rate first, then each sum is taxed and
 * rounded once (qualified invoice rule above). Lines at rate 0 are not part of it.
 */
export function taxByRate(lines: TaxLine[], rounding: Rounding): TaxSummary {
  const byRate = new Map<number, number[]>();
  for (const line of lines) {
    if (line.taxRatePct === 0) continue;
    if (!(TAXABLE_RATES as readonly number[]).includes(line.taxRatePct)) throw new RangeError(`unknown tax rate ${line.taxRatePct} %`);
    byRate.set(line.taxRatePct, [...(byRate.get(line.taxRatePct) ?? []), line.amountYen]);
  }
  const rates = [...byRate.entries()]
    .sort(([a], [b]) => a - b)
    .map(([ratePct, amounts]) => {
      const netYen = sumYen(amounts);
      const taxYen = taxOnSum(netYen, ratePct, rounding);
      return { ratePct, netYen, taxYen, grossYen: netYen + taxYen };
    });
  const netYen = sumYen(rates.map((r) => r.netYen));
  const taxYen = sumYen(rates.map((r) => r.taxYen));
  return { rates, netYen, taxYen, grossYen: netYen + taxYen };
}
