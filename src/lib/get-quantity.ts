import { getLocale, getTranslations } from "next-intl/server";
import { quantityText } from "@/lib/quantity";
import type { Translate } from "@/lib/validation/field-errors";

/** quantityText in the reader's language, for server components: amount(12.5, "kg") → "12.5 kg". */
export async function getQuantity() {
  const t = (await getTranslations()) as unknown as Translate;
  const locale = await getLocale();
  return (value: number, unit: string, maximumFractionDigits = 1) => quantityText(t, locale, value, unit, maximumFractionDigits);
}
