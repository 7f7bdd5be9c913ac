import { describe, expect, it } from "vitest";
import { deliveryPrice, moistureSteps, polishingFee, polishingTier, priceForGrade, type GrowerTerms, type MillTerms, type MoistureRule } from "./supplier-prices";

// Rice is priced per 60 kg bag of brown rice: MAFF publishes its rice price survey
// (相対取引価格) per 玄米60kg — from memory. The 15.0 % moisture ceiling for graded brown rice
// is MAFF's inspection standard (../shared/references.md). Prices and deductions here are
// invented contract terms; every figure is worked by hand beside its test.
const none: MoistureRule = { thresholdPct: 15.0, stepPct: 0.1, deductionYenPerBagPerStep: 0 };
const perTenth: MoistureRule = { thresholdPct: 15.0, stepPct: 0.1, deductionYenPerBagPerStep: 100 };
const perPoint: MoistureRule = { thresholdPct: 15.0, stepPct: 1, deductionYenPerBagPerStep: 500 };

describe("a grower's delivery: price × grade × weight in 60 kg bags", () => {
  it("pays 30 bags of 1st-grade rice at 27,000 yen a bag: 810,000 yen", () => {
    const p = deliveryPrice(27_000, 1_800, 14.6, none);
    expect(p).toMatchObject({ amountYen: 810_000, bags: 30, steps: 0, netPerBagYen: 27_000 });
  });

  it("pays part bags pro rata: 1,230 kg is 20.5 bags → 553,500 yen", () => {
    expect(deliveryPrice(27_000, 1_230, 14.8, none).amountYen).toBe(553_500);
  });

  it("rounds the line half-up to the yen: 1,000.5 kg × 25,500 ÷ 60 = 425,212.5 → 425,213", () => {
    expect(deliveryPrice(25_500, 1_000.5, 14.8, none).amountYen).toBe(425_213);
    expect(deliveryPrice(25_500, 1_000.4, 14.8, none).amountYen).toBe(425_170);
  });

  it("takes the price of the lot's grade from the contract, none for a grade it does not price", () => {
    const terms: GrowerTerms = { pricesPerBagYen: { tokuto: 28_500, "1": 27_000 }, moisture: none };
    expect(priceForGrade(terms, "1")).toBe(27_000);
    expect(priceForGrade(terms, "tokuto")).toBe(28_500);
    expect(priceForGrade(terms, "2")).toBeNull();
    expect(priceForGrade(terms, null)).toBeNull();
  });
});

describe("the moisture deduction above 15.0 %", () => {
  it("counts tenths above the threshold, none at or below it, without float error", () => {
    expect(moistureSteps(15.0, perTenth)).toBe(0);
    expect(moistureSteps(14.2, perTenth)).toBe(0);
    // 15.1 − 15.0 is 0.0999… in binary floating point: still one step.
    expect(moistureSteps(15.1, perTenth)).toBe(1);
    expect(moistureSteps(15.3, perTenth)).toBe(3);
    expect(moistureSteps(null, perTenth)).toBe(0);
  });

  it("counts part of a step as a step, in whole hundredths: 15.04 % over 15.0 % is one step, 15.0 % none", () => {
    // The rule the contract states: part of a step counts as a step (MoistureRule.stepPct).
    expect(moistureSteps(15.04, perTenth)).toBe(1);
    expect(moistureSteps(15.0, perTenth)).toBe(0);
    expect(moistureSteps(15.01, perTenth)).toBe(1);
    expect(moistureSteps(15.11, perTenth)).toBe(2);
    const perHalf: MoistureRule = { thresholdPct: 15.0, stepPct: 0.5, deductionYenPerBagPerStep: 200 };
    expect(moistureSteps(15.5, perHalf)).toBe(1);
    expect(moistureSteps(15.51, perHalf)).toBe(2);
    expect(moistureSteps(15.0, perHalf)).toBe(0);
  });

  it("starts from the contract's own threshold: 14.5 % with 0.1 steps", () => {
    const stricter: MoistureRule = { thresholdPct: 14.5, stepPct: 0.1, deductionYenPerBagPerStep: 100 };
    expect(moistureSteps(14.5, stricter)).toBe(0);
    expect(moistureSteps(14.54, stricter)).toBe(1);
    expect(moistureSteps(15.0, stricter)).toBe(5);
    // 600 kg = 10 bags at 14.8 %: 3 steps × 100 yen off 24,000 → 10 × 23,700 = 237,000 yen.
    expect(deliveryPrice(24_000, 600, 14.8, stricter)).toMatchObject({ amountYen: 237_000, steps: 3 });
  });

  it("counts whole points with part of a point as a point", () => {
    expect(moistureSteps(15.3, perPoint)).toBe(1);
    expect(moistureSteps(16.0, perPoint)).toBe(1);
    expect(moistureSteps(16.1, perPoint)).toBe(2);
  });

  it("deducts per bag: 600 kg at 15.3 %, 100 yen per bag per 0.1 → 10 × (24,000 − 300) = 237,000", () => {
    expect(deliveryPrice(24_000, 600, 15.3, perTenth)).toMatchObject({ amountYen: 237_000, steps: 3, deductionPerBagYen: 300, netPerBagYen: 23_700 });
  });

  it("deducts per point: 900 kg at 16.1 %, 500 yen per bag per point → 15 × (22,000 − 1,000) = 315,000", () => {
    expect(deliveryPrice(22_000, 900, 16.1, perPoint).amountYen).toBe(315_000);
  });

  it("never pays below zero", () => {
    expect(deliveryPrice(200, 60, 18.0, perTenth).amountYen).toBe(0);
  });
});

describe("a mill's polishing fee, tiered by target polishing ratio", () => {
  const terms: MillTerms = { tiers: [{ upToRatioPct: 70, feePerKgYen: 35 }, { upToRatioPct: 50, feePerKgYen: 60 }, { upToRatioPct: 60, feePerKgYen: 45 }, { upToRatioPct: null, feePerKgYen: 30 }] };

  it("picks the lowest tier the target reaches, bounds included", () => {
    expect(polishingTier(terms, 50)?.feePerKgYen).toBe(60);
    expect(polishingTier(terms, 50.1)?.feePerKgYen).toBe(45);
    expect(polishingTier(terms, 60)?.feePerKgYen).toBe(45);
    expect(polishingTier(terms, 70)?.feePerKgYen).toBe(35);
    expect(polishingTier(terms, 72)?.feePerKgYen).toBe(30);
  });

  it("charges per kg of brown rice in: 3,000 kg to 50 % × 60 yen = 180,000 yen", () => {
    expect(polishingFee(terms, 50, 3_000)).toMatchObject({ amountYen: 180_000, feePerKgYen: 60, upToRatioPct: 50 });
  });

  it("rounds half-up: 1,234.567 kg × 45 yen = 55,555.515 → 55,556 yen", () => {
    expect(polishingFee(terms, 58, 1_234.567)?.amountYen).toBe(55_556);
  });

  it("has no fee when no tier covers the target", () => {
    expect(polishingFee({ tiers: [{ upToRatioPct: 60, feePerKgYen: 45 }] }, 65, 1_000)).toBeNull();
  });
});
