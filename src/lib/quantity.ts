import { figureLabelKey, figureUnit, humaniseFigure, isKnownFigure } from "@/domain/figures";
import { formatAmount, quantityText } from "./amount";
import type { Translate } from "@/lib/validation/field-errors";

export { formatAmount, quantityText } from "./amount";

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
