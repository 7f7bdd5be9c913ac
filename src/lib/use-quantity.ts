import { useLocale, useTranslations } from "next-intl";
import { quantityText } from "@/lib/amount";
import type { Translate } from "@/lib/validation/field-errors";

/** quantityText in the reader's language, for client components: amount(800, "bottle") → "800 bottles". */
export function useQuantity() {
  const t = useTranslations() as unknown as Translate;
  const locale = useLocale();
  return (value: number, unit: string, maximumFractionDigits = 1) => quantityText(t, locale, value, unit, maximumFractionDigits);
}
