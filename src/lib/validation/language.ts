import { z } from "zod";
import { LOCALES } from "@/i18n/locale";

/** The language switch: one of the app's languages, or "" to follow the browser again. */
export const languageSchema = z.object({ locale: z.enum(LOCALES).or(z.literal("")) });
export type LanguageInput = z.infer<typeof languageSchema>;
