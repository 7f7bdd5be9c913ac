import { describe, expect, it } from "vitest";
import ledger from "@/i18n/messages/en/ledger.json";
import { alcoholAs95Kg, assessCategories, type CategoryFacts } from "./categories";

// Reasons come as catalogue keys (claims.reasons.*), worded by the claims API (tests/integration/claims.test.ts).
// Boundaries from the NTA labelling standard (清酒の製法品質表示基準, NTA Notification No. 8
// of 1989 as amended in 2003), as tabled in ../shared/references.md.
const base: CategoryFacts = { polishingRatioPct: 50, kojiRatioPct: 20, lowestGrade: "1", addedAlcoholKg: 0, addedAlcohol95Kg: 0, polishedRiceKg: 1000, ginjoMethod: true };
// Alcohol given at 95 % unless a test says otherwise: its weight is then its 95 % weight.
const eligible = (f: Partial<CategoryFacts>) => assessCategories(facts(f)).filter((v) => v.eligible).map((v) => v.name);
const facts = (f: Partial<CategoryFacts>): CategoryFacts => ({ ...base, addedAlcohol95Kg: f.addedAlcoholKg ?? 0, ...f });

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
    const over = assessCategories(facts({ addedAlcoholKg: 100.5 })).find((v) => v.name === "honjozo")!;
    expect(over.eligible).toBe(false);
    expect(over.reasons).toEqual([{ key: "alcoholAbove", values: { pct: "10.05" } }]);
  });

  it("koji rice at 15 % qualifies; 14.9 % does not, for any premium category", () => {
    expect(eligible({ kojiRatioPct: 15 })).toContain("junmai daiginjo");
    expect(eligible({ kojiRatioPct: 14.9 })).toEqual([]);
  });

  it("out-of-grade rice rules out every premium category", () => {
    const verdicts = assessCategories({ ...base, lowestGrade: "out-of-grade" });
    expect(verdicts.every((v) => !v.eligible)).toBe(true);
    expect(verdicts[0]!.reasons).toContainEqual({ key: "gradeBelow", values: { grade: "out-of-grade" } });
  });

  it("a special method lets tokubetsu categories pass the 60 % limit", () => {
    expect(eligible({ polishingRatioPct: 65, ginjoMethod: false, specialMethod: true })).toEqual(["tokubetsu junmai", "junmai"]);
  });
});

describe("tokubetsu categories are kinds of their parent (NTA labelling standard; ../shared/references.md)", () => {
  // The special method stands in for the 60 % limit only. Tokubetsu honjozo is a honjozo, so
  // honjozo's 70 % still binds; tokubetsu junmai is a junmai, and junmai has had no polishing
  // limit since the 2003 amendment (in force 2004), so none binds it beyond junmai's own rules.
  const special = { ginjoMethod: false, specialMethod: true, addedAlcoholKg: 50 };

  it("72 % with a special method and alcohol within the limit: neither tokubetsu honjozo nor honjozo", () => {
    expect(eligible({ ...special, polishingRatioPct: 72 })).toEqual([]);
    const verdict = assessCategories(facts({ ...special, polishingRatioPct: 72 })).find((v) => v.name === "tokubetsu honjozo")!;
    expect(verdict.reasons).toEqual([{ key: "ratioAbove", values: { pct: "72", limit: "70" } }]);
  });

  it("65 % with a special method: tokubetsu honjozo and honjozo; 70 % still; 70.1 % no longer", () => {
    expect(eligible({ ...special, polishingRatioPct: 65 })).toEqual(["tokubetsu honjozo", "honjozo"]);
    expect(eligible({ ...special, polishingRatioPct: 70 })).toEqual(["tokubetsu honjozo", "honjozo"]);
    expect(eligible({ ...special, polishingRatioPct: 70.1 })).toEqual([]);
  });

  it("65 % without a special method: honjozo only", () => {
    expect(eligible({ ...special, specialMethod: false, polishingRatioPct: 65 })).toEqual(["honjozo"]);
  });

  it("tokubetsu junmai keeps junmai's rules: 72 % with a special method and no alcohol qualifies, with alcohol it does not", () => {
    expect(eligible({ ginjoMethod: false, specialMethod: true, polishingRatioPct: 72 })).toEqual(["tokubetsu junmai", "junmai"]);
    expect(eligible({ ...special, polishingRatioPct: 55 })).not.toContain("tokubetsu junmai");
    expect(eligible({ ginjoMethod: false, specialMethod: true, polishingRatioPct: 72, kojiRatioPct: 14 })).toEqual([]);
  });
});

describe("added alcohol is weighed as 95 % alcohol (NTA labelling standard, ≤ 10 % of the polished rice)", () => {
  // Conversion by pure-alcohol content, kg × strength ÷ 95: references.md's worked example,
  // 30 kg at 30 % ≈ 9.47 kg at 95 %. From memory of the standard's definitions ("converted to
  // 95 %"); the densities of the mixtures are not applied.
  it("converts 30 kg at 30 % to about 9.47 kg at 95 %, and 95 % alcohol to itself", () => {
    expect(alcoholAs95Kg(30, 30)).toBeCloseTo(9.4737, 4);
    expect(alcoholAs95Kg(40, 95)).toBe(40);
  });

  it("300 kg of 30 % alcohol on 1,000 kg of rice is 94.7 kg at 95 %: within 10 %, honjozo", () => {
    const f = { polishingRatioPct: 68, ginjoMethod: false, addedAlcoholKg: 300, addedAlcohol95Kg: alcoholAs95Kg(300, 30) };
    expect(eligible(f)).toEqual(["honjozo"]);
  });

  it("330 kg of 30 % alcohol on 1,000 kg of rice is 104.2 kg at 95 %: above 10 %, no honjozo", () => {
    const verdict = assessCategories(facts({ polishingRatioPct: 68, ginjoMethod: false, addedAlcoholKg: 330, addedAlcohol95Kg: alcoholAs95Kg(330, 30) })).find((v) => v.name === "honjozo")!;
    expect(verdict.eligible).toBe(false);
    expect(verdict.reasons).toEqual([{ key: "alcoholAbove", values: { pct: "10.42" } }]);
  });

  it("any alcohol at all rules out the junmai categories, whatever its strength", () => {
    expect(eligible({ addedAlcoholKg: 1, addedAlcohol95Kg: alcoholAs95Kg(1, 30) })).not.toContain("junmai");
  });
});

describe("rice certified equivalent to 3rd grade or better", () => {
  it("counts for the premium categories like 3rd grade", () => {
    expect(eligible({ lowestGrade: "equivalent" })).toEqual(["junmai daiginjo", "junmai ginjo", "tokubetsu junmai", "junmai"]);
  });

  it("does not count while a lot graded equivalent has no certificate attached, and says which", () => {
    const verdicts = assessCategories(facts({ lowestGrade: "equivalent", uncertifiedEquivalentLots: ["H26-0007"] }));
    expect(verdicts.every((v) => !v.eligible)).toBe(true);
    expect(verdicts[0]!.reasons).toEqual([{ key: "noCertificate", values: { lots: "H26-0007" } }]);
  });
});

describe("reasons", () => {
  it("every reason a verdict can give has its words in the catalogue, and the catalogue has none unused", () => {
    const unknown = facts({ polishingRatioPct: null, kojiRatioPct: null, lowestGrade: null, uncertifiedEquivalentLots: ["H26-0007"], ginjoMethod: false });
    const failing = facts({ polishingRatioPct: 99, kojiRatioPct: 10, lowestGrade: "out-of-grade", addedAlcoholKg: 200 });
    const keys = new Set([unknown, failing].flatMap((f) => assessCategories(f).flatMap((v) => v.reasons.map((r) => r.key))));
    // noTank is worded by the claims API itself, when no tank lies behind a lot.
    expect([...keys, "noTank"].sort()).toEqual(Object.keys(ledger.claims.reasons).sort());
  });
});
