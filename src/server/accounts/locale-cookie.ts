import "server-only";
import { serialize } from "cookie";
import { cookies } from "next/headers";
import { LOCALE_COOKIE, type Locale } from "@/i18n/locale";
import { requestIsHttps } from "./session";

// A year: the language is a standing choice, not a session's. Lax, like the session cookie.
const ATTRIBUTES = { path: "/", maxAge: 365 * 24 * 60 * 60, sameSite: "lax" as const, httpOnly: true };

/** For server actions: remembers the language on this browser (the pages and the API read it). */
export async function rememberLocale(locale: Locale): Promise<void> {
  (await cookies()).set(LOCALE_COOKIE, locale, { ...ATTRIBUTES, secure: await requestIsHttps() });
}

/** Back to following the browser's language. */
export async function forgetLocale(): Promise<void> {
  (await cookies()).set(LOCALE_COOKIE, "", { ...ATTRIBUTES, maxAge: 0, secure: await requestIsHttps() });
}

/** For route handlers: the same cookie as a Set-Cookie value. */
export function localeCookieHeader(locale: Locale, secure: boolean): string {
  return serialize(LOCALE_COOKIE, locale, { ...ATTRIBUTES, secure });
}
