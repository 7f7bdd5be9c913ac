import { describe, expect, it } from "vitest";
import { apparentPolishingRatioPct, branYieldPct, ineffectivePolishingPts, missedTarget, roundPct, truePolishingRatioPct, unaccountedKg } from "./polishing";

// Definitions: glossary of the Nada brewers' research association (灘酒研究会), entries
// 精米歩合 (polishing ratio), 真精米歩合 (true polishing ratio), 無効精米歩合 (ineffective part),
// as summarised in ../shared/references.md. The run below is worked by hand from those
// definitions; the 1000-grain weight of brown brewing rice (about 27 g) is from memory.
describe("a polishing run worked by hand", () => {
  const brownKg = 1000;
  const polishedKg = 600;
  const branKg = 385;

  it("apparent ratio = polished ÷ brown × 100", () => {
    expect(apparentPolishingRatioPct(polishedKg, brownKg)).toBe(60);
  });

  it("true ratio = 1000-grain polished ÷ 1000-grain brown × 100, above the apparent one", () => {
    const truePct = truePolishingRatioPct(16.6, 27.0);
    expect(roundPct(truePct)).toBe(61.5);
    expect(roundPct(ineffectivePolishingPts(truePct, 60))).toBe(1.5);
  });

  it("bran yield and what went unaccounted", () => {
    expect(branYieldPct(branKg, brownKg)).toBe(38.5);
    expect(unaccountedKg(brownKg, polishedKg, branKg)).toBe(15);
  });

  it("flags a run more than one point off its target", () => {
    expect(missedTarget(60, 60)).toBe(false);
    expect(missedTarget(61, 60)).toBe(false);
    expect(missedTarget(61.1, 60)).toBe(true);
    expect(missedTarget(58.5, 60, 2)).toBe(false);
  });

  it("refuses a zero brown weight", () => {
    expect(() => apparentPolishingRatioPct(1, 0)).toThrow(RangeError);
  });
});

describe("rounding of brewing percentages", () => {
  // references.md: percentages in brewing records are rounded half-up to one decimal.
  it("rounds half up despite binary fractions", () => {
    expect(roundPct(60.45)).toBe(60.5);
    expect(roundPct(60.44)).toBe(60.4);
    expect(roundPct(35.05)).toBe(35.1);
  });
});
