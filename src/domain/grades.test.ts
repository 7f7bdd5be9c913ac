import { describe, expect, it } from "vitest";
import { isThirdGradeOrBetter, lowestGrade, MAX_MOISTURE_PCT } from "./grades";

// MAFF inspection standards for brown rice (Agricultural Products Inspection Act), as
// summarised in ../shared/references.md; 3rd grade or better from the NTA labelling standard.
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
