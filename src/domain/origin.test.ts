import { describe, expect, it } from "vitest";
import { originStatement, originStatementIn, originsByWeight, sharesBy } from "./origin";

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

// The same rule in Japanese: 国産 or the prefecture's name with 産, several joined by 「、」 in
// descending order of weight (MAFF, 米トレーサビリティ法 — ../shared/references.md); prefecture
// names in kanji from ISO 3166-2:JP.
describe("rice-origin statement in Japanese", () => {
  it("names prefectures in kanji, largest share first, joined by 「、」", () => {
    const origins = originsByWeight([{ region: "Okayama", share: 0.3 }, { region: "Hyogo", share: 0.45 }, { region: "Niigata", share: 0.25 }]);
    expect(originStatementIn(origins, "ja")).toBe("兵庫県産、岡山県産、新潟県産");
    expect(originStatementIn(origins, "en")).toBe("Hyogo, Okayama, Niigata");
  });

  it("says 国産 where no prefecture is known, and keeps a country's name", () => {
    expect(originStatementIn(originsByWeight([{ region: null, share: 0.6 }, { region: "Niigata", share: 0.4 }]), "ja")).toBe("国産、新潟県産");
    expect(originStatementIn(originsByWeight([{ region: "Hokkaido", share: 0.7 }, { region: "米国", share: 0.3 }]), "ja")).toBe("北海道産、米国産");
  });

  it("adds up two spellings of one prefecture before ordering", () => {
    // Hyogo 0.2 + Hyōgo-ken 0.25 = 0.45 outweighs Okayama 0.3, though each alone does not.
    const origins = originsByWeight([{ region: "Okayama", share: 0.3 }, { region: "Hyogo", share: 0.2 }, { region: "Hyōgo-ken", share: 0.25 }, { region: "Tokyo", share: 0.25 }]);
    expect(originStatementIn(origins, "ja")).toBe("兵庫県産、岡山県産、東京都産");
  });
});
