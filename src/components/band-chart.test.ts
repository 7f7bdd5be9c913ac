import { describe, expect, it } from "vitest";
import { bandSegments, chartDomain, niceStep, scaleLinear, slotLayout, ticksOf } from "./band-chart";

// Chart geometry worked by hand; "nice" steps of 1, 2 and 5 × 10ⁿ as in the usual axis-labelling practice.
describe("band chart maths", () => {
  it("picks a 1-2-5 step that cuts the span into at most six parts", () => {
    expect(niceStep(18)).toBe(5); // 18 / 6 = 3 → 5
    expect(niceStep(12)).toBe(2); // 12 / 6 = 2 → 2
    expect(niceStep(6)).toBe(1);
    expect(niceStep(300)).toBe(50);
    expect(niceStep(0.9)).toBeCloseTo(0.2, 12);
    expect(niceStep(0)).toBe(1);
  });

  it("spans every value and band edge with a tenth spare, on whole ticks", () => {
    // Values 27–40 and bands 25–30, 30–35: span 15, spare 1.5 → 23.5–41.5, step 5 → 20–45.
    expect(chartDomain([32, 40, 27], [{ min: 30, max: 35 }, { min: 25, max: 30 }])).toEqual({ lo: 20, hi: 45, step: 5 });
    // One koji temperature 34 °C in 33–36: span 3, spare at least 1 → 32–37, step 1.
    expect(chartDomain([34], [{ min: 33, max: 36 }])).toEqual({ lo: 32, hi: 37, step: 1 });
    expect(chartDomain([], [])).toEqual({ lo: 0, hi: 100, step: 20 });
    expect(ticksOf(20, 45, 5)).toEqual([20, 25, 30, 35, 40, 45]);
    expect(ticksOf(0, 1, 0.2)).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]);
  });

  it("maps values linearly, with the y axis running upwards", () => {
    const y = scaleLinear([20, 45], [244, 24]);
    expect(y(20)).toBe(244);
    expect(y(45)).toBe(24);
    expect(y(32.5)).toBe(134); // half-way: (244 + 24) / 2
    expect(scaleLinear([5, 5], [0, 10])(5)).toBe(5);
  });

  it("gives every point an equal slot and leaves a gap between groups", () => {
    // 620 px less one 20 px gap between the two groups → 600 / 3 slots = 200 px per slot.
    const [koji, mash] = slotLayout([2, 1], 50, 620, 20);
    expect(koji).toEqual({ start: 50, end: 450, centres: [150, 350] });
    expect(mash).toEqual({ start: 470, end: 670, centres: [570] });
    expect(slotLayout([], 0, 100)).toEqual([]);
  });

  it("merges neighbouring slots that share a band into one shaded run", () => {
    const a = { min: 25, max: 30 };
    const b = { min: 28, max: 34 };
    expect(bandSegments([a, { ...a }, b], 0, 300)).toEqual([{ x0: 0, x1: 200, band: a }, { x0: 200, x1: 300, band: b }]);
    expect(bandSegments([a, null, a], 0, 300)).toEqual([{ x0: 0, x1: 100, band: a }, { x0: 200, x1: 300, band: a }]);
  });
});
