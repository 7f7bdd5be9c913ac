export const LOCALES = ["en"] as const;
export type Locale = (typeof LOCALES)[number];
export const DEFAULT_LOCALE: Locale = "en";
export const LOCALE_COOKIE = "grainline-locale";

/** Picks a supported locale from a cookie value or an Accept-Language header; no URL prefixes. */
export function pickLocale(cookieValue: string | undefined, acceptLanguage: string | null): Locale {
  const wanted = [cookieValue, ...(acceptLanguage ?? "").split(",").map((part) => part.split(";")[0]?.trim())];
  for (const tag of wanted) {
    const base = tag?.toLowerCase().split("-")[0];
    const hit = LOCALES.find((l) => l === base);
    if (hit) return hit;
  }
  return DEFAULT_LOCALE;
}
