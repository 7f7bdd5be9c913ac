/**
 * Weights of the brew floor, on the dry (polished-rice) basis. Definitions from the Nada
 * brewers' research association glossary as summarised in ../shared/references.md.
 */

/** Water absorption (%) = (drained soaked weight − dry weight) ÷ dry weight × 100. */
export function waterAbsorptionPct(dryKg: number, drainedKg: number): number {
  if (!(dryKg > 0)) throw new RangeError("dry weight must be positive");
  return ((drainedKg - dryKg) / dryKg) * 100;
}

/** Steaming gain (%) on the dry basis: (steamed weight − dry weight) ÷ dry weight × 100. */
export function steamedGainPct(dryKg: number, steamedKg: number): number {
  if (!(dryKg > 0)) throw new RangeError("dry weight must be positive");
  return ((steamedKg - dryKg) / dryKg) * 100;
}

/** Koji-rice ratio (%) of a tank: koji rice ÷ total polished rice × 100, both dry. */
export function kojiRatioPct(kojiRiceKg: number, totalRiceKg: number): number {
  if (!(totalRiceKg > 0)) throw new RangeError("total rice must be positive");
  return (kojiRiceKg / totalRiceKg) * 100;
}

/** Water ratio (%) of a mash: litres of water ÷ kg of total rice × 100. */
export function waterRatioPct(waterL: number, totalRiceKg: number): number {
  if (!(totalRiceKg > 0)) throw new RangeError("total rice must be positive");
  return (waterL / totalRiceKg) * 100;
}

/** Litres in a bottling: bottle count × bottle size. */
export function litresOfBottles(count: number, bottleMl: number): number {
  return (count * bottleMl) / 1000;
}

/** Whole bottles a volume fills (partly filled bottles are not counted). */
export function bottlesFromLitres(litres: number, bottleMl: number): number {
  if (!(bottleMl > 0)) throw new RangeError("bottle size must be positive");
  return Math.floor((litres * 1000 + 1e-6) / bottleMl);
}

export type Band = { min: number; max: number };
export type BandCheck = "below" | "within" | "above";

export function checkBand(value: number, band: Band): BandCheck {
  if (value < band.min - 1e-9) return "below";
  if (value > band.max + 1e-9) return "above";
  return "within";
}

export const RICE_USES = ["koji", "starter", "mash"] as const;
export type RiceUse = (typeof RICE_USES)[number];

/**
 * The band a lot is held to: its use's, or for rice soaked together and portioned at the split
 * ("mixed", no use yet) the span of every use's band — outside it, no portion can be in band.
 */
export function bandForUse(bands: Record<RiceUse, Band>, use: string | undefined): Band {
  if (RICE_USES.includes(use as RiceUse)) return bands[use as RiceUse];
  const all = RICE_USES.map((u) => bands[u]);
  return { min: Math.min(...all.map((b) => b.min)), max: Math.max(...all.map((b) => b.max)) };
}

/**
 * Default target bands (trade practice, from memory, per ../shared/references.md): water
 * absorption koji 30–35 %, mash 25–30 %; starter between the two. The brewery sets its own.
 */
export const DEFAULT_ABSORPTION_BANDS: Record<RiceUse, Band> = {
  koji: { min: 30, max: 35 },
  starter: { min: 28, max: 33 },
  mash: { min: 25, max: 30 },
};

/** Steaming gain on the dry basis, by use (trade practice, from memory; the brewery sets its own). */
export const DEFAULT_STEAM_GAIN_BANDS: Record<RiceUse, Band> = {
  koji: { min: 35, max: 42 },
  starter: { min: 35, max: 42 },
  mash: { min: 33, max: 40 },
};

/**
 * Checkpoints of a koji batch and their temperature bands in °C. Trade practice, from the
 * schedule summarised in ../shared/references.md: brought in at about 33–36 °C, about 30 °C
 * after inoculation, then warming to the high 30s over about two days. Configurable.
 */
export const KOJI_CHECKPOINTS = ["bringingIn", "inoculation", "rebreaking", "mounding", "finish"] as const;
export type KojiCheckpoint = (typeof KOJI_CHECKPOINTS)[number];
export const DEFAULT_KOJI_BANDS: Record<KojiCheckpoint, Band> = {
  bringingIn: { min: 33, max: 36 },
  inoculation: { min: 29, max: 32 },
  rebreaking: { min: 30, max: 34 },
  mounding: { min: 34, max: 38 },
  finish: { min: 38, max: 42 },
};

/** The measurement name a koji checkpoint is logged under, e.g. "kojiTempBringingIn". */
export const kojiMeasurementName = (c: KojiCheckpoint) => `kojiTemp${c[0]!.toUpperCase()}${c.slice(1)}`;

export const ADDITIONS = ["first", "middle", "final"] as const;
export type Addition = (typeof ADDITIONS)[number];
