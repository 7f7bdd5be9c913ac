import { z } from "zod";
import { KOJI_CHECKPOINTS, RICE_USES } from "@/domain/brewing";
import { isTimeZone } from "@/i18n/dates";
import { typedNumber } from "./typed";

/**
 * The brewery's bands and margin. Percentages are of dry weight (0–100 %), koji room
 * temperatures in °C (0–60), the polishing margin in points (0–10). A band's lower edge
 * must sit below its upper edge; the message is keyed to the upper field.
 */
const figure = (min: number, max: number) => typedNumber(min, max);

/** An IANA zone name the runtime knows (the brewery's clock: day boundaries of screens, exports and PDFs). */
const timeZone = z.string().trim().refine(isTimeZone, { message: "validation.timeZone" });

const band = (min: number, max: number) =>
  z
    .object({ min: figure(min, max), max: figure(min, max) })
    .strict()
    .refine((b) => b.min < b.max, { path: ["max"], message: "settingsPage.minBelowMax" });

const perKey = <K extends string>(keys: readonly K[], schema: z.ZodType<{ min: number; max: number }>) =>
  z.object(Object.fromEntries(keys.map((k) => [k, schema])) as Record<K, typeof schema>).strict();

export const PUBLIC_FIELDS = ["varieties", "origin", "growers", "polishingRatio", "categories", "dates"] as const;

export const settingsSchema = z
  .object({
    polishingMarginPts: figure(0, 10),
    absorptionBands: perKey(RICE_USES, band(0, 100)),
    steamGainBands: perKey(RICE_USES, band(0, 100)),
    kojiBands: perKey(KOJI_CHECKPOINTS, band(0, 60)),
    timeZone,
    publicProvenance: z.object(Object.fromEntries(PUBLIC_FIELDS.map((k) => [k, z.boolean()])) as Record<(typeof PUBLIC_FIELDS)[number], z.ZodBoolean>).strict(),
  })
  .strict();
export type SettingsInput = z.infer<typeof settingsSchema>;

/** The form's flat names ("absorptionBands.koji.min") read back into the nested shape; unknown names are ignored. */
export function settingsFromForm(values: Record<string, string | undefined>): Record<string, unknown> {
  const bands = (group: string, keys: readonly string[]) =>
    Object.fromEntries(keys.map((k) => [k, { min: values[`${group}.${k}.min`], max: values[`${group}.${k}.max`] }]));
  return {
    polishingMarginPts: values.polishingMarginPts,
    absorptionBands: bands("absorptionBands", RICE_USES),
    steamGainBands: bands("steamGainBands", RICE_USES),
    kojiBands: bands("kojiBands", KOJI_CHECKPOINTS),
    timeZone: values.timeZone,
    publicProvenance: Object.fromEntries(PUBLIC_FIELDS.map((k) => [k, values[`publicProvenance.${k}`] === "on"])),
  };
}
