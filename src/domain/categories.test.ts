import { describe, expect, it } from "vitest";
import { assessCategories, type CategoryFacts } from "./categories";

// Boundaries from the NTA labelling standard (清酒の製法品質表示基準, NTA Notification No. 8
// of 1989 as amended in 2003), as tabled in ../shared/references.md.
const base: CategoryFacts = { polishingRatioPct: 50, kojiRatioPct: 20, lowestGrade: "1", addedAlcoholKg: 0, polishedRiceKg: 1000, ginjoMethod: true };
const eligible = (f: Partial<CategoryFacts>) => assessCategories({ ...base, ...f }).filter((v) => v.eligible).map((v) => v.name);

describe("premium categories at their boundaries", () => {
  it("50 % with the ginjo method and no alcohol: junmai daiginjo and every junmai below it", () => {
    expect(eligible({})).toEqual(["junmai daiginjo", "junmai ginjo", "tokubetsu junmai", "junmai"]);
  });

  it("uses the real ratio, not the printed one: 50.01 % is no longer daiginjo; 60.4 % is not ginjo", () => {
    expect(eligible({ polishingRatioPct: 50.01 })).toEqual(["junmai ginjo", "tokubetsu junmai", "junmai"]);
    expect(eligible({ polishingRatioPct: 60.4 })).toEqual(["junmai"]);
    expect(eligible({ polishingRatioPct: 60 })).toContain("junmai ginjo");
  });

  it("70 % with alcohol added: honjozo; 70.1 %: nothing premium", () => {
    expect(eligible({ polishingRatioPct: 70, addedAlcoholKg: 50, ginjoMethod: false })).toEqual(["honjozo"]);
    expect(eligible({ polishingRatioPct: 70.1, addedAlcoholKg: 50, ginjoMethod: false })).toEqual([]);
  });

  it("alcohol at exactly 10 % of the rice weight qualifies; above it does not", () => {
    expect(eligible({ addedAlcoholKg: 100 })).toEqual(["daiginjo", "ginjo", "tokubetsu honjozo", "honjozo"]);
    const over = assessCategories({ ...base, addedAlcoholKg: 100.5 }).find((v) => v.name === "honjozo")!;
    expect(over.eligible).toBe(false);
    expect(over.reasons).toEqual(["added alcohol 10.05 % of the rice weight is above 10 %"]);
  });

  it("koji rice at 15 % qualifies; 14.9 % does not, for any premium category", () => {
    expect(eligible({ kojiRatioPct: 15 })).toContain("junmai daiginjo");
    expect(eligible({ kojiRatioPct: 14.9 })).toEqual([]);
  });

  it("out-of-grade rice rules out every premium category", () => {
    const verdicts = assessCategories({ ...base, lowestGrade: "out-of-grade" });
    expect(verdicts.every((v) => !v.eligible)).toBe(true);
    expect(verdicts[0]!.reasons).toContain("rice graded out-of-grade is below 3rd grade");
  });

  it("a special method lets tokubetsu categories pass the 60 % limit", () => {
    expect(eligible({ polishingRatioPct: 65, ginjoMethod: false, specialMethod: true })).toEqual(["tokubetsu junmai", "junmai"]);
  });
});
