import { figureLabelKey, figureUnit, humaniseFigure, isKnownFigure } from "@/domain/figures";
import type { Translate } from "@/lib/validation/field-errors";

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

/** A figure's name: its catalogue label, or its key spelt out if the catalogue has none. */
export function figureName(t: Translate, key: string): string {
  return isKnownFigure(key) ? t(figureLabelKey(key)) : humaniseFigure(key);
}

/** A figure's value with its unit ("Moisture: 14.8 %"); words and flags are left to the caller. */
export function figureText(t: Translate, locale: string, key: string, value: number, recordedUnit?: string | null): string {
  const unit = figureUnit(key, recordedUnit);
  const amount = unit ? quantityText(t, locale, value, unit, 3) : formatAmount(locale, value, 3);
  return `${figureName(t, key)}: ${amount}`;
}
