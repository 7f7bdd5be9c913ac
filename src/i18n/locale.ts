/** Japanese first: the people who use Grainline read Japanese; English is the second language. */
export const LOCALES = ["ja", "en"] as const;
export type Locale = (typeof LOCALES)[number];
export const DEFAULT_LOCALE: Locale = "ja";
export const LOCALE_COOKIE = "grainline-locale";

export function isLocale(value: unknown): value is Locale {
  return typeof value === "string" && (LOCALES as readonly string[]).includes(value);
}

/**
 * Picks a supported locale: the user's own setting first, then a cookie (the language switch of
 * someone signed out), then Accept-Language in its order; Japanese when none matches. No URL prefixes.
 */
export function pickLocale(cookieValue: string | undefined, acceptLanguage: string | null, userSetting?: string | null): Locale {
  if (isLocale(userSetting)) return userSetting;
  if (isLocale(cookieValue)) return cookieValue;
  const tags = (acceptLanguage ?? "")
    .split(",")
    .map((part) => {
      const [tag, ...params] = part.split(";").map((s) => s.trim());
      const q = params.find((p) => p.startsWith("q="));
      return { base: tag?.toLowerCase().split("-")[0] ?? "", q: q ? Number(q.slice(2)) : 1 };
    })
    .filter((entry) => entry.base && Number.isFinite(entry.q) && entry.q > 0)
    .sort((a, b) => b.q - a.q);
  for (const { base } of tags) if (isLocale(base)) return base;
  return DEFAULT_LOCALE;
}
