import { isThirdGradeOrBetter, type Grade } from "./grades";

/**
 * Premium sake categories, from the National Tax Agency's labelling standard for sake
 * (清酒の製法品質表示基準, NTA Notification No. 8 of 1989 as amended; table in
 * ../shared/references.md). Limits apply to the real value — a 60.4 % lot is not ginjo,
 * though its label would print "60 %".
 */
export type CategoryFacts = {
  polishingRatioPct: number | null;
  kojiRatioPct: number | null;
  lowestGrade: Grade | null;
  addedAlcoholKg: number;
  polishedRiceKg: number;
  ginjoMethod: boolean;
  /** A special method explained on the label (tokubetsu categories without the 60 % limit). */
  specialMethod?: boolean;
};

type Rule = { name: string; maxRatio: number | null; alcohol: "none" | "up-to-10"; ginjo: boolean; special?: boolean };

export const CATEGORY_RULES: Rule[] = [
  { name: "junmai daiginjo", maxRatio: 50, alcohol: "none", ginjo: true },
  { name: "daiginjo", maxRatio: 50, alcohol: "up-to-10", ginjo: true },
  { name: "junmai ginjo", maxRatio: 60, alcohol: "none", ginjo: true },
  { name: "ginjo", maxRatio: 60, alcohol: "up-to-10", ginjo: true },
  { name: "tokubetsu junmai", maxRatio: 60, alcohol: "none", ginjo: false, special: true },
  { name: "tokubetsu honjozo", maxRatio: 60, alcohol: "up-to-10", ginjo: false, special: true },
  { name: "honjozo", maxRatio: 70, alcohol: "up-to-10", ginjo: false },
  // No polishing limit since the 2003 amendment.
  { name: "junmai", maxRatio: null, alcohol: "none", ginjo: false },
];

export const MIN_KOJI_RATIO_PCT = 15;
// Float division leaves 1380 ÷ 2300 × 100 at 60.00000000000001; a billionth of a point is noise, not polish.
const EPS = 1e-9;
export const MAX_ALCOHOL_SHARE_PCT = 10;

export type CategoryVerdict = { name: string; eligible: boolean; reasons: string[] };

export function assessCategories(f: CategoryFacts): CategoryVerdict[] {
  const alcoholPct = f.polishedRiceKg > 0 ? (f.addedAlcoholKg / f.polishedRiceKg) * 100 : 0;
  return CATEGORY_RULES.map((rule) => {
    const reasons: string[] = [];
    if (f.kojiRatioPct === null || f.kojiRatioPct < MIN_KOJI_RATIO_PCT - EPS) reasons.push(`koji rice ${fmt(f.kojiRatioPct)} % is below 15 % of the rice`);
    if (f.lowestGrade === null || !isThirdGradeOrBetter(f.lowestGrade)) reasons.push(`rice graded ${f.lowestGrade ?? "unknown"} is below 3rd grade`);
    const special = rule.special && f.specialMethod;
    if (rule.maxRatio !== null && !special && (f.polishingRatioPct === null || f.polishingRatioPct > rule.maxRatio + EPS)) {
      reasons.push(`polishing ratio ${fmt(f.polishingRatioPct)} % is above ${rule.maxRatio} %`);
    }
    if (rule.alcohol === "none" && f.addedAlcoholKg > 0) reasons.push("distilled alcohol was added");
    if (rule.alcohol === "up-to-10") {
      if (f.addedAlcoholKg <= 0) reasons.push("no distilled alcohol was added (a junmai category applies)");
      else if (alcoholPct > MAX_ALCOHOL_SHARE_PCT + EPS) reasons.push(`added alcohol ${fmt(alcoholPct)} % of the rice weight is above 10 %`);
    }
    if (rule.ginjo && !f.ginjoMethod) reasons.push("not brewed by the ginjo method");
    return { name: rule.name, eligible: reasons.length === 0, reasons };
  });
}

const fmt = (v: number | null) => (v === null ? "unknown" : String(Math.round(v * 100) / 100));
