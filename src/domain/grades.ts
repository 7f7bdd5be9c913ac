/**
 * Inspection grades of brown rice under the Agricultural Products Inspection Act (MAFF):
 * brewing rice has two grades above 1st (tokujo, tokuto); ordinary rice 1st to 3rd; below
 * that, out of grade. Listed best first. Moisture may not exceed 15.0 % at any grade.
 */
export const GRADES = ["tokujo", "tokuto", "1", "2", "3", "out-of-grade"] as const;
export type Grade = (typeof GRADES)[number];

export const MAX_MOISTURE_PCT = 15.0;

/** The worst grade among several lots: what a premium-category check must look at. */
export function lowestGrade(grades: Grade[]): Grade | null {
  if (grades.length === 0) return null;
  return grades.reduce((worst, g) => (GRADES.indexOf(g) > GRADES.indexOf(worst) ? g : worst));
}

/** Premium categories need brown rice of 3rd grade or better (NTA labelling standard). */
export function isThirdGradeOrBetter(grade: Grade): boolean {
  return GRADES.indexOf(grade) <= GRADES.indexOf("3");
}
