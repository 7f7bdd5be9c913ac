import { z } from "zod";
import { CATEGORY_RULES } from "@/domain/categories";
import { isValidGtin, toGtin14 } from "@/domain/gtin";
import { typedNumber } from "./typed";

/** The categories a label may claim (NTA labelling standard), or "" for none (futsū-shu). */
export const CLAIMABLE_CATEGORIES = CATEGORY_RULES.map((r) => r.name);

/** A product of the register: brand name, category claimed, bottle size, GTIN (kept as GTIN-14). */
export const productSchema = z.object({
  name: z.string().trim().min(1).max(120),
  category: z.union([z.literal(""), z.enum(CLAIMABLE_CATEGORIES as [string, ...string[]])]).default(""),
  bottleMl: typedNumber(1, 20_000, { int: true }),
  // Spaces and hyphens as printed under a barcode are dropped; the check digit must hold (GS1 §7.9).
  gtin: z
    .string()
    .transform((s) => s.replace(/[\s-]/g, ""))
    .refine(isValidGtin, { message: "validation.gtin" })
    .transform(toGtin14),
});
export type ProductInput = z.infer<typeof productSchema>;
