/**
 * Numbers and dates as people type them, on a Japanese or an English keyboard.
 *
 * Text is NFKC-normalised first (Unicode UAX #15): full-width digits １２６０, the full-width
 * comma ，, period ． , plus ＋, minus － and the ideographic space become their ASCII forms.
 * The group separator "," and decimal separator "." are the CLDR number symbols of both
 * `ja` and `en`; that a group after the first holds exactly three digits is common practice
 * (both locales group by thousands, CLDR `#,##0.###`).
 */

// U+2212 MINUS SIGN survives NFKC; some keyboards and CLDR locales produce it for "−".
const MINUS_SIGNS = /[\u2212\u2012\u2013]/g;
const NUMBER = /^([+-])?(?:(\d{1,3}(?:,\d{3})+|\d+)(?:\.(\d+))?|\.(\d+))$/;

function normalise(text: string): string {
  return text.normalize("NFKC").replace(MINUS_SIGNS, "-").trim();
}

/**
 * The number a person typed, or null when the text is not one. Blank text is null too:
 * whether a value is required is the schema's question. No exponent, hex or "Infinity".
 */
export function parseTypedNumber(text: string): number | null {
  const match = NUMBER.exec(normalise(text));
  if (!match) return null;
  const [, sign, whole, fraction, bareFraction] = match;
  const digits = bareFraction !== undefined ? `0.${bareFraction}` : `${whole!.replaceAll(",", "")}${fraction !== undefined ? `.${fraction}` : ""}`;
  const value = Number(digits);
  if (!Number.isFinite(value)) return null;
  // -0 is not a quantity anyone means; it would print as "-0 kg".
  return sign === "-" && value !== 0 ? -value : value;
}

const SLASHED = /^(\d{4})([/-])(\d{1,2})\2(\d{1,2})$/;
const KANJI = /^(\d{4})\s*年\s*(\d{1,2})\s*月\s*(\d{1,2})\s*日$/;

/** A real calendar day (Gregorian, proleptic as in ECMA-262 Date) as YYYY-MM-DD, or null. */
export function calendarDay(year: number, month: number, day: number): string | null {
  if (year < 1000 || year > 9999 || month < 1 || month > 12 || day < 1) return null;
  const date = new Date(Date.UTC(year, month - 1, day));
  if (date.getUTCMonth() !== month - 1 || date.getUTCDate() !== day) return null;
  return `${year}-${String(month).padStart(2, "0")}-${String(day).padStart(2, "0")}`;
}

/**
 * A day typed as 2026/10/03, 2026-10-03, 2026/1/3, ２０２６／１０／０３ or 2026年10月3日, as
 * YYYY-MM-DD; null for anything else, a day the calendar lacks (2026/02/30) or a two-digit year.
 */
export function parseTypedDate(text: string): string | null {
  const plain = normalise(text);
  const slashed = SLASHED.exec(plain);
  if (slashed) return calendarDay(Number(slashed[1]), Number(slashed[3]), Number(slashed[4]));
  const kanji = KANJI.exec(plain);
  if (kanji) return calendarDay(Number(kanji[1]), Number(kanji[2]), Number(kanji[3]));
  return null;
}
