import { isValidGtin, toGtin14 } from "./gtin";

/**
 * How Grainline's ledger speaks GS1 EPCIS 2.0 / CBV 2.0 (EPCIS-JSON-Schema.json of
 * github.com/gs1/EPCIS, copied in fixtures/epcis/). Where CBV has a term it is used bare, as
 * the JSON-LD context expects; where it has none the value is a full URI of our own, which
 * the schema accepts for any URI outside the GS1 namespaces.
 */
export const EPCIS_CONTEXT = "https://ref.gs1.org/standards/epcis/2.0.0/epcis-context.jsonld";
export const EPCIS_SCHEMA_VERSION = "2.0";

/**
 * Our own identifiers live under the reserved `.invalid` top-level domain (RFC 2606 §2): they
 * can never clash with a real site and say plainly that nobody should dereference them.
 */
export const GRAINLINE_VOCAB = "https://grainline.invalid/voc/";
export const VOCAB_PREFIX = "gl";
export const BIZSTEP_BASE = "https://grainline.invalid/bizstep/";
const ID_BASE = "https://id.grainline.invalid/";

/** The brewery works in Japan (Asia/Tokyo, UTC+9, no daylight saving time). */
export const TIME_ZONE_OFFSET = "+09:00";

export const TRANSFORMATION_STEPS = ["polishing", "soaking", "steaming", "splitting", "koji-making", "starter", "mash-addition", "pressing", "blending", "bottling"] as const;
export type TransformationStep = (typeof TRANSFORMATION_STEPS)[number];

export const isTransformationStep = (step: string): step is TransformationStep => (TRANSFORMATION_STEPS as readonly string[]).includes(step);

/**
 * CBV 2.0 business steps for the steps it names. CBV has no "transforming" step, and
 * nothing for soaking, steaming or koji-making, so every transformation takes our own URI.
 */
const CBV_BIZSTEPS: Record<string, string> = {
  registering: "commissioning",
  receiving: "receiving",
  shipping: "shipping",
  measuring: "sensor_reporting",
};

export function bizStepOf(step: string): string {
  return CBV_BIZSTEPS[step] ?? BIZSTEP_BASE + encodeURIComponent(step);
}

/** EPCIS 2.0 action: a registration brings a lot into being; the others only observe it. */
export const ACTION_OF_STEP: Record<string, "ADD" | "OBSERVE"> = {
  registering: "ADD",
  receiving: "OBSERVE",
  shipping: "OBSERVE",
  measuring: "OBSERVE",
};

/** CBV 2.0 dispositions: the state a lot is left in by the step. */
export const DISPOSITION_OF_STEP: Record<string, string> = {
  registering: "active",
  receiving: "in_progress",
  shipping: "in_transit",
};

/** UN/ECE Recommendation 20 codes: KGM kilogram, LTR litre, H87 piece (a bottle). */
export const UOM_OF_UNIT = { kg: "KGM", L: "LTR", bottle: "H87" } as const;
export type LotUnit = keyof typeof UOM_OF_UNIT;

export function uomOf(unit: string): string {
  const uom = UOM_OF_UNIT[unit as LotUnit];
  if (!uom) throw new RangeError(`no UN/ECE Rec 20 code for unit ${unit}`);
  return uom;
}

/**
 * Measurements that fit an EPCIS 2.0 sensor report: the GS1 measurement type
 * and the UN/ECE Rec 20 unit (CEL degree Celsius, MIN minute, HUR hour, GRM gram, KGM
 * kilogram, LTR litre, P1 percent). Other units are left out of the export, and so are
 * targets (`targetPolishingRatioPct`): a setting is not a reading.
 */
export const SENSOR_OF_UNIT: Record<string, { type: string; uom: string }> = {
  "°C": { type: "Temperature", uom: "CEL" },
  min: { type: "Time", uom: "MIN" },
  h: { type: "Time", uom: "HUR" },
  g: { type: "Mass", uom: "GRM" },
  kg: { type: "Mass", uom: "KGM" },
  L: { type: "Volume", uom: "LTR" },
  "%": { type: "Dimensionless", uom: "P1" },
};

export function sensorOf(measurement: { name: string; unit: string }): { type: string; uom: string } | null {
  if (/^target[A-Z]/.test(measurement.name)) return null;
  return SENSOR_OF_UNIT[measurement.unit] ?? null;
}

/**
 * The class-level identifier of a lot. A bottling with a valid GTIN is a GS1 product batch,
 * named by its GS1 Digital Link URI on id.gs1.org (Digital Link 1.x: /01/{gtin14}/10/{lot});
 * every other lot has no GTIN, so it takes a URI of our own scheme.
 */
export function lotClassUri(code: string, gtin?: unknown): string {
  if (typeof gtin === "string" && isValidGtin(gtin)) return `https://id.gs1.org/01/${toGtin14(gtin)}/10/${encodeURIComponent(code)}`;
  return `${ID_BASE}lot/${encodeURIComponent(code)}`;
}

export const eventUri = (id: number) => `${ID_BASE}event/${id}`;
export const partyUri = (id: string) => `${ID_BASE}party/${encodeURIComponent(id)}`;
/** A party's premises as a business location: Grainline knows places by party, not by GLN. */
export const partyLocationUri = (id: string) => `${ID_BASE}location/${encodeURIComponent(id)}`;

/** A correction reverses the whole event: as recorded, it did not happen (CBV 2.0 error reason). */
export const ERROR_REASON_OF_REVERSAL = "did_not_occur";

/** ISO 8601 with the offset written out, e.g. 2025-03-20T14:00:00.000+09:00 (EPCIS eventTime, FDA KDE dates). */
export function timeAtOffset(at: Date, offset: string = TIME_ZONE_OFFSET): string {
  const match = /^([+-])(\d{2}):(\d{2})$/.exec(offset);
  if (!match) throw new RangeError(`not an offset: ${offset}`);
  const minutes = (match[1] === "-" ? -1 : 1) * (Number(match[2]) * 60 + Number(match[3]));
  return new Date(at.getTime() + minutes * 60_000).toISOString().replace("Z", offset);
}
