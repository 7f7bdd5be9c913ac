import { z } from "zod";
import { optionalTypedNumber, typedNumber } from "./typed";

/** Form inputs send "" for a blank box; treat it as "not given". Numbers are read as typed ("1,260", "１３.５"). */
const blankToUndefined = (v: unknown) => (v === "" || v === null ? undefined : v);
const optionalNumber = (min: number, max: number) => optionalTypedNumber(min, max);

export const fieldSchema = z.object({
  name: z.string().trim().min(1).max(120),
  // Prefecture-level region: what rice-origin statements name.
  region: z.string().trim().min(1).max(80),
  areaHa: typedNumber(0, 10_000, { positive: true }),
  latitude: optionalNumber(-90, 90),
  longitude: optionalNumber(-180, 180),
  growerId: z.preprocess(blankToUndefined, z.string().min(1).max(64).optional()),
});
export type FieldInput = z.infer<typeof fieldSchema>;

/** The JSON API takes numbers as numbers (../shared/api.md); only forms send strings to coerce. */
export const fieldApiSchema = fieldSchema.extend({
  areaHa: z.number().finite().positive().max(10_000),
  latitude: z.number().min(-90).max(90).optional(),
  longitude: z.number().min(-180).max(180).optional(),
  growerId: z.string().min(1).max(64).optional(),
});
