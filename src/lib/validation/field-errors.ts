import type { z } from "zod";

export type Translate = (key: string, values?: Record<string, string | number>) => string;

/**
 * Turns zod issues into `{ field: [message] }`, the messages taken from the catalogue
 * (`validation.*`) so that forms and the API speak the user's language.
 */
export function fieldErrorsFrom(error: z.ZodError, t: Translate): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const field = issue.path.length ? issue.path.join(".") : "_";
    (out[field] ??= []).push(messageFor(issue, t));
  }
  return out;
}

function messageFor(issue: z.core.$ZodIssue, t: Translate): string {
  if (issue.message.startsWith("validation.")) return t(issue.message);
  switch (issue.code) {
    case "invalid_type":
      // zod 4 leaves `input` off its issues; its own message says what was received.
      return /received (undefined|null)$/.test(issue.message)
        ? t("validation.required")
        : t("validation.invalidType", { expected: String(issue.expected) });
    case "too_small":
      if (issue.origin === "string" && Number(issue.minimum) === 1) return t("validation.required");
      return t(issue.origin === "string" ? "validation.tooShort" : "validation.tooSmall", {
        minimum: Number(issue.minimum),
      });
    case "too_big":
      return t(issue.origin === "string" ? "validation.tooLong" : "validation.tooBig", {
        maximum: Number(issue.maximum),
      });
    case "invalid_format":
      return issue.format === "email" ? t("validation.email") : t("validation.format");
    case "invalid_value":
      return t("validation.oneOf", { options: issue.values.map(String).join(", ") });
    case "unrecognized_keys":
      return t("validation.unknownKeys", { keys: issue.keys.join(", ") });
    default:
      return t("validation.format");
  }
}
