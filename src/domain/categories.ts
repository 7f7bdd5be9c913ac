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
  /** Brewing alcohol added, kg at the strength it was added. */
  addedAlcoholKg: number;
  /** The same, converted to 95 % alcohol (alcoholAs95Kg): what the 10 % limit weighs. */
  addedAlcohol95Kg: number;
  polishedRiceKg: number;
  ginjoMethod: boolean;
  /** A special method explained on the label (tokubetsu categories without the 60 % limit). */
  specialMethod?: boolean;
  /** Harvest lots graded "equivalent" with no certificate attached: they cannot vouch for 3rd grade. */
  uncertifiedEquivalentLots?: string[];
};

/** `kindOf`: the category a tokubetsu one is a kind of; its limits still bind when the special method lifts the 60 %. */
type Rule = { name: string; maxRatio: number | null; alcohol: "none" | "up-to-10"; ginjo: boolean; special?: boolean; kindOf?: string };

export const CATEGORY_RULES: Rule[] = [
  { name: "junmai daiginjo", maxRatio: 50, alcohol: "none", ginjo: true },
  { name: "daiginjo", maxRatio: 50, alcohol: "up-to-10", ginjo: true },
  { name: "junmai ginjo", maxRatio: 60, alcohol: "none", ginjo: true },
  { name: "ginjo", maxRatio: 60, alcohol: "up-to-10", ginjo: true },
  { name: "tokubetsu junmai", maxRatio: 60, alcohol: "none", ginjo: false, special: true, kindOf: "junmai" },
  { name: "tokubetsu honjozo", maxRatio: 60, alcohol: "up-to-10", ginjo: false, special: true, kindOf: "honjozo" },
  { name: "honjozo", maxRatio: 70, alcohol: "up-to-10", ginjo: false },
  // No polishing limit since the 2003 amendment.
  { name: "junmai", maxRatio: null, alcohol: "none", ginjo: false },
];

export const MIN_KOJI_RATIO_PCT = 15;
// Float division leaves 1380 ÷ 2300 × 100 at 60.00000000000001; a billionth of a point is noise, not polish.
const EPS = 1e-9;
export const MAX_ALCOHOL_SHARE_PCT = 10;
/** Measurement names: the weight of brewing alcohol added (kg) and its strength (% alcohol by volume). */
export const ADDED_ALCOHOL_KG = "addedAlcoholKg";
export const ADDED_ALCOHOL_STRENGTH_PCT = "addedAlcoholStrengthPct";
/** The strength the standard weighs added alcohol at; also what a reading without its strength is taken as. */
export const REFERENCE_ALCOHOL_PCT = 95;

/**
 * Brewing alcohol's weight converted to 95 % alcohol by its pure-alcohol content:
 * kg × strength ÷ 95 (30 kg at 30 % ≈ 9.47 kg). The standard weighs added alcohol "converted
 * to 95 %" (from memory of its definitions; ../shared/references.md). Weight is scaled by the
 * strength by volume, as the trade states it; the densities of the two mixtures are not applied.
 */
export function alcoholAs95Kg(kg: number, strengthPct: number): number {
  return (kg * strengthPct) / REFERENCE_ALCOHOL_PCT;
}

/** The polishing limit a rule applies: a special method stands in for the 60 % only, never for its parent's limit. */
function ratioLimit(rule: Rule, specialMethod: boolean): number | null {
  if (!(rule.special && specialMethod)) return rule.maxRatio;
  return CATEGORY_RULES.find((r) => r.name === rule.kindOf)?.maxRatio ?? null;
}

/** Why a category is not met: a key of the catalogue's claims.reasons and its values, worded where it is shown. */
export type Reason = { key: string; values?: Record<string, string> };
export type CategoryVerdict = { name: string; eligible: boolean; reasons: Reason[] };

export function assessCategories(f: CategoryFacts): CategoryVerdict[] {
  const alcoholPct = f.polishedRiceKg > 0 ? (f.addedAlcohol95Kg / f.polishedRiceKg) * 100 : 0;
  const uncertified = f.uncertifiedEquivalentLots ?? [];
  return CATEGORY_RULES.map((rule) => {
    const reasons: Reason[] = [];
    const because = (key: string, values?: Record<string, string>) => reasons.push(values ? { key, values } : { key });
    if (f.kojiRatioPct === null) because("kojiUnknown");
    else if (f.kojiRatioPct < MIN_KOJI_RATIO_PCT - EPS) because("kojiBelow", { pct: fmt(f.kojiRatioPct) });
    if (f.lowestGrade === null) because("gradeUnknown");
    else if (!isThirdGradeOrBetter(f.lowestGrade)) because("gradeBelow", { grade: f.lowestGrade });
    if (uncertified.length) because("noCertificate", { lots: uncertified.join(", ") });
    const limit = ratioLimit(rule, f.specialMethod === true);
    if (limit !== null && f.polishingRatioPct === null) because("ratioUnknown", { limit: String(limit) });
    else if (limit !== null && f.polishingRatioPct! > limit + EPS) because("ratioAbove", { pct: fmt(f.polishingRatioPct!), limit: String(limit) });
    if (rule.alcohol === "none" && f.addedAlcoholKg > 0) because("alcoholAdded");
    if (rule.alcohol === "up-to-10") {
      if (f.addedAlcoholKg <= 0) because("noAlcohol");
      else if (alcoholPct > MAX_ALCOHOL_SHARE_PCT + EPS) because("alcoholAbove", { pct: fmt(alcoholPct) });
    }
    if (rule.ginjo && !f.ginjoMethod) because("notGinjo");
    return { name: rule.name, eligible: reasons.length === 0, reasons };
  });
}

const fmt = (v: number) => String(Math.round(v * 100) / 100);
