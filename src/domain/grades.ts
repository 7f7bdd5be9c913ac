/**
 * Inspection grades of brown rice under the Agricultural Products Inspection Act (MAFF):
 * brewing rice has two grades above 1st (tokujo, tokuto); ordinary rice 1st to 3rd; below
 * that, out of grade. Listed best first. Moisture may not exceed 15.0 % at any grade.
 *
 * "equivalent" is rice not inspected under the Act but certified equivalent to 3rd grade or
 * better (the NTA labelling standard's "or equivalent"). It ranks as 3rd grade, never above:
 * the certificate vouches for 3rd or better, not for which.
 */
export const GRADES = ["tokujo", "tokuto", "1", "2", "3", "equivalent", "out-of-grade"] as const;
export type Grade = (typeof GRADES)[number];

export const MAX_MOISTURE_PCT = 15.0;

/** The worst grade among several lots: what a premium-category check must look at. */
export function lowestGrade(grades: Grade[]): Grade | null {
  if (grades.length === 0) return null;
  return grades.reduce((worst, g) => (GRADES.indexOf(g) > GRADES.indexOf(worst) ? g : worst));
}

/** Premium categories need brown rice of 3rd grade or better, or certified equivalent (NTA labelling standard). */
export function isThirdGradeOrBetter(grade: Grade): boolean {
  return GRADES.indexOf(grade) <= GRADES.indexOf("equivalent");
}

/**
 * A percentage as whole hundredths of a point. Moisture meters read to 0.1 % (common
 * practice), so hundredths hold every reading exactly; float subtraction would not
 * (15.04 − 15.0 is 0.03999…, 15.1 − 15.0 is 0.0999…).
 */
export function hundredthsOf(pct: number): number {
  return Math.round(pct * 100);
}

/** How far a moisture reading is above a threshold, in hundredths of a point (0 or less: not above). */
export function moistureExcessHundredths(moisturePct: number, thresholdPct: number): number {
  return hundredthsOf(moisturePct) - hundredthsOf(thresholdPct);
}

/** Above the MAFF ceiling brown rice takes no grade; the same comparison the moisture deduction uses. */
export function isTooMoistToGrade(moisturePct: number): boolean {
  return moistureExcessHundredths(moisturePct, MAX_MOISTURE_PCT) > 0;
}
