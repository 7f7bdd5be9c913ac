import { describe, expect, it } from "vitest";
import { hundredthsOf, isThirdGradeOrBetter, isTooMoistToGrade, lowestGrade, MAX_MOISTURE_PCT, moistureExcessHundredths } from "./grades";

// MAFF inspection standards for brown rice (Agricultural Products Inspection Act), as
// summarised in ../shared/references.md; 3rd grade or better, "or equivalent", from the NTA
// labelling standard (清酒の製法品質表示基準, same file).
describe("inspection grades", () => {
  it("orders brewing-rice top grades above 1st", () => {
    expect(lowestGrade(["tokujo", "1", "tokuto"])).toBe("1");
    expect(lowestGrade(["tokujo", "tokuto"])).toBe("tokuto");
    expect(lowestGrade(["2", "out-of-grade", "tokujo"])).toBe("out-of-grade");
    expect(lowestGrade([])).toBeNull();
  });

  it("draws the premium line at 3rd grade", () => {
    expect(isThirdGradeOrBetter("3")).toBe(true);
    expect(isThirdGradeOrBetter("tokujo")).toBe(true);
    expect(isThirdGradeOrBetter("out-of-grade")).toBe(false);
  });

  it("caps moisture at 15.0 % at every grade", () => {
    expect(MAX_MOISTURE_PCT).toBe(15);
  });
});

describe("rice certified equivalent to 3rd grade or better", () => {
  it("meets the premium line, as the standard's 'or equivalent' allows", () => {
    expect(isThirdGradeOrBetter("equivalent")).toBe(true);
  });

  it("ranks as 3rd grade for the lowest grade, never better", () => {
    expect(lowestGrade(["1", "equivalent"])).toBe("equivalent");
    expect(lowestGrade(["equivalent", "3"])).toBe("equivalent");
    expect(lowestGrade(["3", "equivalent", "tokujo"])).toBe("equivalent");
    expect(lowestGrade(["equivalent", "out-of-grade"])).toBe("out-of-grade");
  });
});

describe("moisture against a threshold, in whole hundredths of a point", () => {
  it("holds readings exactly where float subtraction does not", () => {
    // 15.04 − 15.0 is 0.03999… and 15.1 − 15.0 is 0.0999… in binary floating point.
    expect(hundredthsOf(15.04)).toBe(1504);
    expect(moistureExcessHundredths(15.04, 15.0)).toBe(4);
    expect(moistureExcessHundredths(15.1, 15.0)).toBe(10);
    expect(moistureExcessHundredths(15.0, 15.0)).toBe(0);
    expect(moistureExcessHundredths(14.99, 15.0)).toBe(-1);
  });

  it("takes no grade above 15.0 % (MAFF), by the comparison the moisture deduction uses", () => {
    expect(isTooMoistToGrade(15.0)).toBe(false);
    expect(isTooMoistToGrade(15.01)).toBe(true);
    expect(isTooMoistToGrade(15.04)).toBe(true);
    expect(isTooMoistToGrade(14.99)).toBe(false);
    // A value that is 15.0 but for float noise is 15.0.
    expect(isTooMoistToGrade(0.1 * 150)).toBe(false);
    expect(isTooMoistToGrade(15.000000000000002)).toBe(false);
  });
});
