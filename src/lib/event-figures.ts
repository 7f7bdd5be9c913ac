import { portionOf } from "@/domain/floor-offer";
import { figureName, figureText } from "@/lib/quantity";
import type { Translate } from "@/lib/validation/field-errors";

/**
 * Attributes shown elsewhere or not at all: the receipt's slip and arrival (their own line),
 * ids, and nested structures with panels of their own (bands, portions, koji checks).
 */
const NOT_LISTED = new Set(["slipQuantity", "arrivalQuantity", "shortfall", "dispatch", "productId", "band", "bandCheck", "portions", "kojiChecks", "mixedVarietiesConfirmed", "use", "addition"]);

/**
 * An event's attributes as lines a person reads — "Water absorption: 32 %", "For the first
 * addition", "Started: 3 Oct 2026, 08:00" — labelled from the catalogue, in the map's units.
 * `t` translates the whole catalogue; `dateTime` formats a moment for the reader.
 */
export function attributeLines(attributes: Record<string, unknown>, t: Translate, locale: string, dateTime: (d: Date) => string): string[] {
  const lines: string[] = [];
  // A mash addition names only its addition; the rice's use is then the mash.
  const purpose = portionOf(attributes.addition && !attributes.use ? { use: "mash", addition: attributes.addition } : attributes);
  if (purpose) lines.push(t(`floorForms.purpose.${purpose}`));
  for (const [key, value] of Object.entries(attributes)) {
    if (NOT_LISTED.has(key) || value === null || value === undefined || value === "") continue;
    if (typeof value === "number") lines.push(figureText(t, locale, key, value));
    else if (typeof value === "boolean") lines.push(`${figureName(t, key)}: ${t(value ? "lotPage.yes" : "lotPage.no")}`);
    else if (typeof value === "string") lines.push(`${figureName(t, key)}: ${key === "startedAt" ? moment(value, dateTime) : value}`);
  }
  return lines;
}

/** A recorded time for the reader; text that is not one is shown as written. */
function moment(value: string, dateTime: (d: Date) => string): string {
  const d = new Date(value);
  return Number.isNaN(d.getTime()) ? value : dateTime(d);
}
