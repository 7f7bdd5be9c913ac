import "server-only";
import { parse as parseCookies } from "cookie";
import { LOCALE_COOKIE, pickLocale, type Locale } from "@/i18n/locale";
import { translator } from "@/i18n/messages";
import type { Translate } from "@/lib/validation/field-errors";

/**
 * The language of a document a signed-in person downloads (a PDF): their own setting, then the
 * language switch's cookie, then the browser's Accept-Language — as the pages choose (src/i18n/request.ts).
 */
export function documentLocale(request: { headers: { get(name: string): string | null } }, reader: { locale?: Locale | null }): Locale {
  const cookie = parseCookies(request.headers.get("cookie") ?? "")[LOCALE_COOKIE];
  return pickLocale(cookie, request.headers.get("accept-language"), reader.locale);
}

/** The catalogue of one locale as the documents' Translate. */
export function documentTranslator(locale: Locale): Translate {
  const t = translator(locale);
  return (key, values) => t(key as never, values as never);
}
