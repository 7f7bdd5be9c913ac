/**
 * Money in Grainline is integer yen: the yen has no minor unit in use (ISO 4217 lists JPY
 * with 0 decimals), so every amount stored or shown is a whole number. Fractions arise only
 * inside a computation (a price per 60 kg bag times a weight, a tax rate times a sum) and are
 * rounded once, by a rule that is named where it is used.
 */
export const ROUNDINGS = ["down", "half-up", "up"] as const;
export type Rounding = (typeof ROUNDINGS)[number];

export function assertYen(value: number, what = "amount"): number {
  if (!Number.isSafeInteger(value)) throw new RangeError(`${what} must be a whole number of yen, got ${value}`);
  return value;
}

/**
 * numerator ÷ denominator as a whole number, exactly (BigInt, no float error), rounded on its
 * magnitude: "down" drops the fraction, "up" takes the next yen, "half-up" rounds half a yen
 * away from zero. Applying the rule to the magnitude makes a reversal the exact mirror of
 * the amount it reverses.
 */
export function divideRounded(numerator: number, denominator: number, rule: Rounding): number {
  assertYen(numerator, "numerator");
  assertYen(denominator, "denominator");
  if (denominator <= 0) throw new RangeError("denominator must be positive");
  const negative = numerator < 0;
  const n = BigInt(Math.abs(numerator));
  const d = BigInt(denominator);
  let q = n / d;
  const r = n - q * d;
  if (r > 0n && (rule === "up" || (rule === "half-up" && 2n * r >= d))) q += 1n;
  const magnitude = Number(q);
  return negative ? -magnitude : magnitude;
}

/** Weights are kept to the gram: kilograms with at most three decimals, as integer grams. */
export function gramsOf(kg: number): number {
  if (!Number.isFinite(kg) || kg < 0) throw new RangeError(`weight must be a non-negative number of kg, got ${kg}`);
  return Math.round(kg * 1000);
}

export const sumYen = (values: number[]) => values.reduce((a, v) => a + assertYen(v), 0);

/** How the brewery pays a supplier; a plain list so the payment form needs no validation library in the browser. */
export const PAYMENT_METHODS = ["bank-transfer", "cash", "offset", "other"] as const;
