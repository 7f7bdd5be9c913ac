import { z } from "zod";
import { VARIETY_KINDS } from "@/domain/varieties";
import { typedNumber } from "./typed";

const blankToUndefined = (v: unknown) => (v === "" || v === null ? undefined : v);

/** A tank of the register as the settings form sends it (a blank id adds a tank). */
export const tankEntrySchema = z.object({
  id: z.preprocess(blankToUndefined, z.string().regex(/^tank-[a-z0-9]{1,24}$/).optional()),
  name: z.string().trim().min(1).max(40),
  // Capacity in litres; a sake tank rarely exceeds a few tens of kL (common practice).
  capacityL: typedNumber(0, 200_000, { positive: true }),
  location: z.string().trim().max(80).default(""),
  // A checkbox: "on" when ticked, absent when not.
  active: z.preprocess((v) => v === "on" || v === true || v === "true", z.boolean()),
});
export type TankEntryInput = z.infer<typeof tankEntrySchema>;

export const varietyEntrySchema = z.object({
  name: z.string().trim().min(1).max(60),
  kind: z.enum(VARIETY_KINDS),
});

export const varietyRemovalSchema = z.object({ name: z.string().trim().min(1).max(60) });
