/**
 * Ageing of what the brewery owes a supplier, in the usual 30-day buckets (common practice
 * in accounts payable). Payments settle the oldest charges first (FIFO, common practice), so
 * what is still owed is the newest charges: the balance is laid over the charges from the
 * newest back. Days are calendar days on the brewery's clock (its time-zone setting).
 */
import { dayIn, DEFAULT_TIME_ZONE } from "@/i18n/dates";

export const AGEING_BUCKETS = ["days0to30", "days31to60", "days61to90", "over90"] as const;
export type AgeingBucket = (typeof AGEING_BUCKETS)[number];
export type Ageing = Record<AgeingBucket, number>;

const DAY_MS = 86_400_000;
const dayNumber = (at: Date, timeZone: string) => Date.parse(`${dayIn(at, timeZone)}T00:00:00Z`) / DAY_MS;

export function ageInDays(at: Date, asOf: Date, timeZone = DEFAULT_TIME_ZONE): number {
  return Math.max(0, dayNumber(asOf, timeZone) - dayNumber(at, timeZone));
}

export function bucketOf(days: number): AgeingBucket {
  if (days <= 30) return "days0to30";
  if (days <= 60) return "days31to60";
  if (days <= 90) return "days61to90";
  return "over90";
}

export function ageBalance(charges: { at: Date; amountYen: number }[], balanceYen: number, asOf: Date, timeZone = DEFAULT_TIME_ZONE): Ageing {
  const out: Ageing = { days0to30: 0, days31to60: 0, days61to90: 0, over90: 0 };
  if (balanceYen <= 0) return out;
  const newestFirst = charges.filter((c) => c.amountYen > 0).sort((a, b) => b.at.getTime() - a.at.getTime());
  let left = balanceYen;
  for (const charge of newestFirst) {
    if (left === 0) break;
    const take = Math.min(left, charge.amountYen);
    out[bucketOf(ageInDays(charge.at, asOf, timeZone))] += take;
    left -= take;
  }
  // More owed than the charges explain (an adjustment stated gross): the oldest bucket holds it.
  if (left > 0) out[bucketOf(newestFirst.length ? ageInDays(newestFirst[newestFirst.length - 1]!.at, asOf, timeZone) : 0)] += left;
  return out;
}
