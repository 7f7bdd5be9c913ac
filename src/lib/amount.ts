import type { Translate } from "@/lib/validation/field-errors";

// Apart from quantity.ts (figures and their units table) so the scan screen's lot card, which
// only writes amounts, does not ship the figure tables.

/**
 * A number as the reader's locale writes it, never "-0": signDisplay "negative" drops the sign
 * of a negative zero and of a negative value that rounds to zero (ECMA-402 Intl.NumberFormat
 * v3, in Node since 20 and in current browsers).
 */
export function formatAmount(locale: string, value: number, maximumFractionDigits = 1): string {
  return new Intl.NumberFormat(locale, { maximumFractionDigits, signDisplay: "negative" }).format(value);
}

/** The number the reader sees, for choosing a plural form: 1.04 shown as "1" is one bottle. */
const shown = (value: number, digits: number) => Math.abs(Math.round(value * 10 ** digits) / 10 ** digits);

/**
 * An amount with its unit, worded by the catalogue (`lot.amount`): "12.5 kg", "800 bottles",
 * "1 bag"; in Japanese 「800本」「1袋」. `t` is a translator of the whole catalogue.
 */
export function quantityText(t: Translate, locale: string, value: number, unit: string, maximumFractionDigits = 1): string {
  return t("lot.amount", { amount: formatAmount(locale, value, maximumFractionDigits), count: shown(value, maximumFractionDigits), unit }).trim();
}
