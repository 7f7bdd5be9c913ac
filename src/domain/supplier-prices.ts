import { GRADES, hundredthsOf, MAX_MOISTURE_PCT, moistureExcessHundredths, type Grade } from "./grades";
import { divideRounded, gramsOf } from "./money";
import { BAG_KG } from "./steps";

/**
 * What a contract says a supplier is paid. Rice is priced per 60 kg bag by inspection grade
 * (common practice in the Japanese rice trade); a delivery is paid pro rata for its weight,
 * so 1,230 kg is 20.5 bags. Line amounts are rounded half-up to the yen (common practice;
 * a contract may say otherwise).
 */
export const MOISTURE_STEPS_PCT = [0.1, 0.5, 1] as const;
export type MoistureStepPct = (typeof MOISTURE_STEPS_PCT)[number];

export type MoistureRule = {
  /** Above this moisture the deduction starts: 15.0 % (the MAFF ceiling for graded brown rice) unless the contract sets its own. */
  thresholdPct: number;
  /** Deduct per 0.1, 0.5 or whole point above the threshold; part of a step counts as a step. */
  stepPct: MoistureStepPct;
  deductionYenPerBagPerStep: number;
};
export type GrowerTerms = { pricesPerBagYen: Partial<Record<Grade, number>>; moisture: MoistureRule };

/** A polishing tier: up to (and including) a target ratio; null is the last tier, "above". */
export type MillTier = { upToRatioPct: number | null; feePerKgYen: number };
export type MillTerms = { tiers: MillTier[] };

export const DEFAULT_MOISTURE_RULE: MoistureRule = { thresholdPct: MAX_MOISTURE_PCT, stepPct: 0.1, deductionYenPerBagPerStep: 0 };

/**
 * How many deduction steps a moisture reading is above the threshold (0 at or below it).
 * Worked in whole hundredths (the comparison the harvest grade check uses), so 15.04 % over
 * 15.0 % is 4 hundredths: part of a 0.1 step, which counts as one.
 */
export function moistureSteps(moisturePct: number | null, rule: MoistureRule): number {
  if (moisturePct == null) return 0;
  const excess = moistureExcessHundredths(moisturePct, rule.thresholdPct);
  if (excess <= 0) return 0;
  return Math.ceil(excess / hundredthsOf(rule.stepPct));
}

export type DeliveryPrice = { amountYen: number; bags: number; grams: number; steps: number; deductionPerBagYen: number; netPerBagYen: number };

/**
 * A grower's delivery: (price per bag − steps × deduction per bag) × weight ÷ 60 kg, in whole
 * yen, never below zero. Worked in grams so that the division is exact.
 */
export function deliveryPrice(pricePerBagYen: number, kg: number, moisturePct: number | null, rule: MoistureRule): DeliveryPrice {
  const grams = gramsOf(kg);
  const steps = moistureSteps(moisturePct, rule);
  const deductionPerBagYen = steps * rule.deductionYenPerBagPerStep;
  const netPerBagYen = Math.max(0, pricePerBagYen - deductionPerBagYen);
  return {
    amountYen: divideRounded(netPerBagYen * grams, BAG_KG * 1000, "half-up"),
    bags: grams / (BAG_KG * 1000),
    grams,
    steps,
    deductionPerBagYen,
    netPerBagYen,
  };
}

export function priceForGrade(terms: GrowerTerms, grade: string | null): number | null {
  if (!grade || !(GRADES as readonly string[]).includes(grade)) return null;
  return terms.pricesPerBagYen[grade as Grade] ?? null;
}

/** The tier of a run: the first (lowest) "up to" the target reaches, else the open-ended one. */
export function polishingTier(terms: MillTerms, targetRatioPct: number): MillTier | null {
  const bounded = terms.tiers.filter((t) => t.upToRatioPct !== null).sort((a, b) => a.upToRatioPct! - b.upToRatioPct!);
  return bounded.find((t) => targetRatioPct <= t.upToRatioPct! + 1e-9) ?? terms.tiers.find((t) => t.upToRatioPct === null) ?? null;
}

export type PolishingFee = { amountYen: number; feePerKgYen: number; upToRatioPct: number | null; grams: number };

/** A mill's fee: brown rice in (kg) × the fee per kg of the run's tier, in whole yen. */
export function polishingFee(terms: MillTerms, targetRatioPct: number, brownKg: number): PolishingFee | null {
  const tier = polishingTier(terms, targetRatioPct);
  if (!tier) return null;
  const grams = gramsOf(brownKg);
  return { amountYen: divideRounded(tier.feePerKgYen * grams, 1000, "half-up"), feePerKgYen: tier.feePerKgYen, upToRatioPct: tier.upToRatioPct, grams };
}
