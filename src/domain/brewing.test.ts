import { describe, expect, it } from "vitest";
import { bottlesFromLitres, checkBand, DEFAULT_ABSORPTION_BANDS, kojiRatioPct, litresOfBottles, steamedGainPct, waterAbsorptionPct, waterRatioPct } from "./brewing";
import { roundPct } from "./polishing";

// Definitions: Nada brewers' research association glossary (灘酒研究会), summarised in
// ../shared/references.md. Values worked by hand from those definitions.
describe("soaking and steaming on the dry basis", () => {
  it("water absorption = (drained − dry) ÷ dry × 100", () => {
    expect(waterAbsorptionPct(150, 195)).toBe(30);
    expect(roundPct(waterAbsorptionPct(120, 161.3))).toBe(34.4);
  });

  it("steaming gain likewise", () => {
    expect(steamedGainPct(150, 207)).toBeCloseTo(38, 10);
  });

  it("checks against the target band of the use (trade practice defaults)", () => {
    expect(checkBand(30, DEFAULT_ABSORPTION_BANDS.koji)).toBe("within");
    expect(checkBand(29.9, DEFAULT_ABSORPTION_BANDS.koji)).toBe("below");
    expect(checkBand(31, DEFAULT_ABSORPTION_BANDS.mash)).toBe("above");
  });
});

describe("the tank", () => {
  it("koji ratio = koji rice ÷ total rice; references.md gives 20–23 % as typical", () => {
    // 1,000 kg total rice of which 220 kg became koji.
    expect(kojiRatioPct(220, 1000)).toBe(22);
  });

  it("water ratio = water ÷ total rice; references.md gives 120–135 %", () => {
    expect(waterRatioPct(1300, 1000)).toBe(130);
  });
});

describe("bottles and litres (common practice: 1.8 L and 720 mL bottles)", () => {
  it("converts both ways", () => {
    expect(litresOfBottles(100, 1800)).toBe(180);
    expect(litresOfBottles(250, 720)).toBe(180);
    expect(bottlesFromLitres(180, 720)).toBe(250);
    expect(bottlesFromLitres(180.5, 1800)).toBe(100);
  });
});
