/**
 * Polishing figures. Definitions from the glossary of the Nada brewers' research
 * association (灘酒研究会), as summarised in ../shared/references.md:
 * apparent ratio = polished weight ÷ brown weight × 100; true ratio = 1000-grain weight
 * of polished ÷ 1000-grain weight of brown × 100; the difference is the "ineffective"
 * part (broken grains, moisture lost).
 */

/** Percentages in brewing records are rounded half-up to one decimal (references.md). */
export function roundPct(value: number): number {
  return Math.sign(value) * Math.floor(Math.abs(value) * 10 + 0.5 + 1e-9) / 10;
}

export function apparentPolishingRatioPct(polishedKg: number, brownKg: number): number {
  if (!(brownKg > 0)) throw new RangeError("brown-rice weight must be positive");
  return (polishedKg / brownKg) * 100;
}

export function truePolishingRatioPct(thousandGrainPolishedG: number, thousandGrainBrownG: number): number {
  if (!(thousandGrainBrownG > 0)) throw new RangeError("1000-grain weight of brown rice must be positive");
  return (thousandGrainPolishedG / thousandGrainBrownG) * 100;
}

/** Bran yield: bran ÷ brown weight × 100. */
export function branYieldPct(branKg: number, brownKg: number): number {
  if (!(brownKg > 0)) throw new RangeError("brown-rice weight must be positive");
  return (branKg / brownKg) * 100;
}

/** True − apparent: how much of the removed weight was broken grain and moisture, not polish. */
export function ineffectivePolishingPts(truePct: number, apparentPct: number): number {
  return truePct - apparentPct;
}

/** Weight that left the run as neither polished rice nor weighed bran (dust, moisture). */
export function unaccountedKg(brownKg: number, polishedKg: number, branKg: number): number {
  return brownKg - polishedKg - branKg;
}

/** A run is flagged when it missed its target by more than the margin (default 1 point). */
export function missedTarget(achievedPct: number, targetPct: number, marginPts = 1): boolean {
  return Math.abs(achievedPct - targetPct) > marginPts + 1e-9;
}
