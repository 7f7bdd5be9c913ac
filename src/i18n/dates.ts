import type { DateTimeFormatOptions } from "use-intl/core";
import type { Locale } from "./locale";

/**
 * Dates as each language writes them, in the brewery's time zone. The same option sets are
 * next-intl's named formats (`format.dateTime(d, "day")`, request.ts) and what PDFs, CSV files
 * and e-mails use through the functions below, so a day reads the same everywhere.
 * Japanese: 2026/10/03 and 2026/10/03 14:05 (JIS X 0301 order, year first); English:
 * "Oct 3, 2026" and "Oct 3, 2026, 14:05" (CLDR `en` medium date; a 24-hour clock as the floor uses).
 */
export const DEFAULT_TIME_ZONE = "Asia/Tokyo";

export type DateFormatName = "day" | "dayTime";

// use-intl's option type: next-intl's `formats` takes it (a narrower Intl.DateTimeFormatOptions).
export const DATE_FORMATS: Record<Locale, Record<DateFormatName, DateTimeFormatOptions>> = {
  ja: {
    day: { year: "numeric", month: "2-digit", day: "2-digit" },
    dayTime: { year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit", hourCycle: "h23" },
  },
  en: {
    day: { year: "numeric", month: "short", day: "numeric" },
    dayTime: { year: "numeric", month: "short", day: "numeric", hour: "2-digit", minute: "2-digit", hourCycle: "h23" },
  },
};

/** True for a zone name the runtime's IANA tz data knows (ECMA-402 `Intl.supportedValuesOf`). */
export function isTimeZone(name: unknown): name is string {
  if (typeof name !== "string" || !name) return false;
  return Intl.supportedValuesOf("timeZone").includes(name) || name === "UTC";
}

const CALENDAR_DAY = /^\d{4}-\d{2}-\d{2}$/;

/**
 * A bare "YYYY-MM-DD" is a calendar day already (a harvest date): it is written as it is,
 * never moved by a zone. Anything else is an instant, shown on the brewery's clock.
 */
function instantAndZone(at: Date | string, timeZone: string): [Date, string] {
  if (typeof at === "string" && CALENDAR_DAY.test(at)) return [new Date(`${at}T00:00:00Z`), "UTC"];
  return [typeof at === "string" ? new Date(at) : at, timeZone];
}

export function formatDate(at: Date | string, locale: Locale, timeZone: string, name: DateFormatName): string {
  const [instant, zone] = instantAndZone(at, timeZone);
  return new Intl.DateTimeFormat(locale, { ...DATE_FORMATS[locale][name], timeZone: zone }).format(instant);
}

export const formatDay = (at: Date | string, locale: Locale, timeZone: string) => formatDate(at, locale, timeZone, "day");
export const formatDayTime = (at: Date | string, locale: Locale, timeZone: string) => formatDate(at, locale, timeZone, "dayTime");

// A formatter costs far more to build than to use; lists of events reuse one per zone.
const dayFormatters = new Map<string, Intl.DateTimeFormat>();
function dayFormatter(timeZone: string): Intl.DateTimeFormat {
  let found = dayFormatters.get(timeZone);
  if (!found) dayFormatters.set(timeZone, (found = new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" })));
  return found;
}

/** The calendar day ("YYYY-MM-DD") an instant falls on in a zone: the day boundary of exports. */
export function dayIn(at: Date, timeZone: string): string {
  const parts = dayFormatter(timeZone).formatToParts(at);
  const get = (type: string) => parts.find((p) => p.type === type)!.value;
  return `${get("year")}-${get("month")}-${get("day")}`;
}

/** At most this many days are listed; more read as the first and last day and how many. */
export const DAYS_LISTED = 8;

/**
 * Instants as the days to show, each day (on the zone's clock) once, by the first instant of it:
 * all of them while there are at most `most`, otherwise the first and last and how many days.
 * A house blend brewed in 530 tanks over ten seasons has 530 days of first additions behind it:
 * listed, they made the bottle's page 80 kB, took 13 ms to write, and ran off the A4 sheet.
 */
export function daysShown(isos: string[], timeZone: string, most = DAYS_LISTED): { days: string[] } | { first: string; last: string; count: number } {
  // ISO instants sort as time does; a day's instants then come together.
  const days: string[] = [];
  let last = "";
  for (const iso of [...isos].sort()) {
    // An instant as a number: inside a page, Next wraps the Date constructor, and 1,000 of them cost 2 ms.
    const day = dayFormatter(timeZone).format(Date.parse(iso));
    if (day !== last) days.push(iso), (last = day);
  }
  return days.length <= most ? { days } : { first: days[0]!, last: days.at(-1)!, count: days.length };
}

/**
 * An hour of a calendar day on a zone's clock, as an ISO instant: a day typed on a form
 * (a receipt's date) recorded at a time that stays on that day wherever the brewery is.
 */
export function hourOfDayIn(day: string, hour: number, timeZone: string): string {
  return new Date(startOfDayIn(day, timeZone).getTime() + hour * 3_600_000).toISOString();
}

/** The calendar day after a YYYY-MM-DD day (proleptic Gregorian, as ECMA-262 Date counts). */
export const nextDay = (day: string) => new Date(Date.parse(`${day}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10);

/** Milliseconds the zone's clock is ahead of UTC at an instant. */
function offsetAt(at: number, timeZone: string): number {
  const parts = new Intl.DateTimeFormat("en-US", { timeZone, hourCycle: "h23", year: "numeric", month: "numeric", day: "numeric", hour: "numeric", minute: "numeric", second: "numeric" }).formatToParts(at);
  const n = (type: string) => Number(parts.find((p) => p.type === type)!.value);
  return Date.UTC(n("year"), n("month") - 1, n("day"), n("hour"), n("minute"), n("second")) - Math.floor(at / 1000) * 1000;
}

/** The instant a calendar day ("YYYY-MM-DD") begins in a zone (twice corrected, for a day a DST change touches). */
export function startOfDayIn(day: string, timeZone: string): Date {
  const midnightUtc = Date.parse(`${day}T00:00:00Z`);
  let at = midnightUtc - offsetAt(midnightUtc, timeZone);
  at = midnightUtc - offsetAt(at, timeZone);
  return new Date(at);
}
