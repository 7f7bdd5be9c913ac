import { describe, expect, it } from "vitest";
import { originStatement, originsByWeight, sharesBy } from "./origin";

// MAFF, rice traceability act (米トレーサビリティ法): several origins in descending order of
// weight; prefecture names for Japanese rice, "domestic" where the prefecture is not given.
describe("rice-origin statement", () => {
  it("lists prefectures by weight, largest first", () => {
    expect(originStatement([{ region: "Okayama", share: 0.3 }, { region: "Hyogo", share: 0.45 }, { region: "Hyogo", share: 0.25 }])).toBe("Hyogo, Okayama");
  });

  it("says domestic where no prefecture is known", () => {
    expect(originsByWeight([{ region: null, share: 0.2 }, { region: "Hyogo", share: 0.8 }])).toEqual([
      { origin: "Hyogo", share: 0.8 },
      { origin: "domestic", share: 0.2 },
    ]);
  });

  it("adds shares by any key", () => {
    expect(sharesBy([{ v: "Omachi", s: 0.2 }, { v: "Yamada Nishiki", s: 0.5 }, { v: "Omachi", s: 0.3 }], (x) => x.v, (x) => x.s)).toEqual([
      { name: "Omachi", share: 0.5 },
      { name: "Yamada Nishiki", share: 0.5 },
    ]);
  });
});
