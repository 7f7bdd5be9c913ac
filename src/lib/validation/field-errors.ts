import type { z } from "zod";

export type Translate = (key: string, values?: Record<string, string | number>) => string;

/**
 * Turns zod issues into `{ field: [message] }`, the messages taken from the catalogue
 * (`validation.*`) so that forms and the API speak the user's language. zod's own English
 * ("Too small: expected number to be >=0") never gets through: every issue code has a sentence.
 */
export function fieldErrorsFrom(error: z.ZodError, t: Translate): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const field = issue.path.length ? issue.path.join(".") : "_";
    (out[field] ??= []).push(messageFor(issue, t));
  }
  return out;
}

/** The sentence for each type a field can expect; numbers and days share typed.ts's sentences. */
const TYPE_KEYS: Record<string, string> = {
  number: "validation.number",
  int: "validation.wholeNumber",
  bigint: "validation.wholeNumber",
  date: "validation.date",
  string: "validation.types.string",
  boolean: "validation.types.boolean",
  array: "validation.types.array",
  object: "validation.types.object",
  file: "validation.types.file",
};
/** Formats that are dates or times: the sentence shows how a day is written. */
const DATE_FORMATS = new Set(["date", "datetime", "time", "duration"]);

export function messageFor(issue: z.core.$ZodIssue, t: Translate): string {
  if (issue.message.startsWith("validation.")) return t(issue.message);
  switch (issue.code) {
    case "invalid_type":
      // zod 4 leaves `input` off its issues; its own message says what was received.
      if (/received (undefined|null)$/.test(issue.message)) return t("validation.required");
      return t(TYPE_KEYS[issue.expected] ?? "validation.invalidType");
    case "too_small":
      return bound(issue.origin, "Small", issue.minimum, issue.inclusive !== false, issue.exact === true, t);
    case "too_big":
      return bound(issue.origin, "Big", issue.maximum, issue.inclusive !== false, issue.exact === true, t);
    case "invalid_format":
      if (issue.format === "email") return t("validation.email");
      if (issue.format === "url") return t("validation.url");
      return t(DATE_FORMATS.has(issue.format) ? "validation.date" : "validation.format");
    case "not_multiple_of":
      return t("validation.multipleOf", { divisor: Number(issue.divisor) });
    case "invalid_value":
      return t("validation.oneOf", { options: issue.values.map(String).join(", ") });
    case "unrecognized_keys":
      return t("validation.unknownKeys", { keys: issue.keys.join(", ") });
    default:
      // invalid_union, invalid_key, invalid_element and a custom check without a catalogue key.
      return t("validation.format");
  }
}

/**
 * A bound broken: text length, list length, a date or a number (at least / more than, at most /
 * less than). A required text (at least one character) is worded as missing.
 */
function bound(origin: string, side: "Small" | "Big", limit: unknown, inclusive: boolean, exact: boolean, t: Translate): string {
  const n = Number(limit);
  if (origin === "string") {
    if (side === "Small" && n === 1 && !exact) return t("validation.required");
    return t(exact ? "validation.exactLength" : side === "Small" ? "validation.tooShort" : "validation.tooLong", { count: n });
  }
  if (origin === "array" || origin === "set") return t(side === "Small" ? "validation.tooFew" : "validation.tooMany", { count: n });
  if (origin === "date") return t(side === "Small" ? "validation.dateFrom" : "validation.dateTo", { date: new Date(n).toISOString().slice(0, 10) });
  if (side === "Small") return t(inclusive ? "validation.tooSmall" : "validation.moreThan", { minimum: n });
  return t(inclusive ? "validation.tooBig" : "validation.lessThan", { maximum: n });
}
