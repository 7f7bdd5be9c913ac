import { KOJI_CHECKPOINTS, kojiMeasurementName } from "./brewing";

/**
 * The figures an event carries — its measurements by name and its attributes by key — each with
 * the unit it is written in. Every screen that lists them (lot page events, the audit record, the
 * floor) names them by the catalogue (`lotPage.figures.<key>`), never by the camelCase key.
 * `null`: a figure without a unit (a count, a word, a flag).
 */
export const FIGURES: Readonly<Record<string, string | null>> = {
  // Measurements sent with events (floor forms, the mill's run, the moisture card, the seed).
  moisturePct: "%",
  targetPolishingRatioPct: "%",
  thousandGrainWeightBrownG: "g",
  thousandGrainWeightPolishedG: "g",
  soakMinutes: "min",
  waterTempC: "°C",
  steamMinutes: "min",
  sporeG: "g",
  waterL: "L",
  addedAlcoholKg: "kg",
  addedAlcoholStrengthPct: "%",
  alcoholPct: "%",
  mashTempC: "°C",
  acidity: null,
  ...Object.fromEntries(KOJI_CHECKPOINTS.map((c) => [kojiMeasurementName(c), "°C"])),
  // Attributes the server works out (polishing-runs.ts, floor-steps.ts, receipts.ts, harvests.ts).
  brownKg: "kg",
  polishedKg: "kg",
  branKg: "kg",
  achievedPolishingRatioPct: "%",
  truePolishingRatioPct: "%",
  branYieldPct: "%",
  marginPts: "pts",
  missedTarget: null,
  mixedVarietiesConfirmed: null,
  varieties: null,
  use: null,
  addition: null,
  dryKg: "kg",
  drainedKg: "kg",
  absorptionPct: "%",
  steamedKg: "kg",
  gainPct: "%",
  kojiKg: "kg",
  riceKg: "kg",
  starterKg: "kg",
  startedAt: null,
  mashKg: "kg",
  sakeL: "L",
  leesKg: "kg",
  litresIn: "L",
  litresOut: "L",
  litres: "L",
  gtin: null,
  bottleMl: "mL",
  bottles: null,
  productName: null,
  category: null,
  claimSupported: null,
  slipQuantity: null,
  arrivalQuantity: null,
  shortfall: null,
  bags: null,
};

export const figureLabelKey = (key: string) => `lotPage.figures.${key}`;
export const isKnownFigure = (key: string) => Object.hasOwn(FIGURES, key);

/** The unit a figure is written in: the map's, else the one recorded with it, else what its key ends in. */
export function figureUnit(key: string, recorded?: string | null): string | null {
  if (isKnownFigure(key)) return FIGURES[key] ?? null;
  return recorded || (suffixOf(key)?.[1] ?? null);
}

// Unit endings of a key, longest first: moistureStepPct, soakMinutes, waterTempC.
const SUFFIXES: [RegExp, string][] = [
  [/Pct$/, "%"],
  [/Minutes$/, "min"],
  [/Min$/, "min"],
  [/Kg$/, "kg"],
  [/Ml$/, "mL"],
  [/Pts$/, "pts"],
  [/TempC$/, "°C"],
  [/G$/, "g"],
  [/L$/, "L"],
];
const suffixOf = (key: string) => SUFFIXES.find(([re]) => re.test(key));

/**
 * A figure the map does not know (an older record, a name sent through the API): its words
 * spelt out, its unit ending dropped — "moistureStepPct" reads "Moisture step".
 */
export function humaniseFigure(key: string): string {
  const suffix = suffixOf(key);
  const stem = suffix ? key.replace(suffix[0], suffix[1] === "°C" ? "Temp" : "") : key;
  const words = stem.replace(/([a-z0-9])([A-Z])/g, "$1 $2").replace(/[_-]+/g, " ").trim().toLowerCase();
  return words ? words[0]!.toUpperCase() + words.slice(1) : key;
}
