import { createTranslator } from "next-intl";
import en from "./messages/en.json";
import type { Locale } from "./locale";

export type Messages = typeof en;
const CATALOGUES: Record<Locale, Messages> = { en };

export function loadMessages(locale: Locale): Messages {
  return CATALOGUES[locale];
}

/** A translator usable outside React (route handlers, e-mail, the seed). */
export function translator(locale: Locale) {
  return createTranslator({ locale, messages: loadMessages(locale) });
}
