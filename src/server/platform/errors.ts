import { translator } from "@/i18n/messages";
import type { Translate } from "@/lib/validation/field-errors";

/** The one application error. Its code decides the HTTP status, in one place. */
export type ErrorCode =
  | "unauthenticated"
  | "forbidden"
  | "not_found"
  | "conflict"
  | "invalid"
  | "rate_limited"
  | "too_large";

export const STATUS_FOR_CODE: Record<ErrorCode, number> = {
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  invalid: 422,
  rate_limited: 429,
  too_large: 413,
};

export type FieldErrors = Record<string, string[]>;

/**
 * How an error is worded: a key of the message catalogue (src/i18n/messages) and its values.
 * The answer to a request says it in the reader's language; `message` keeps the English for logs.
 */
export type ErrorMessage = { key: string; values?: Record<string, string | number> };

const english = translator("en");
const inEnglish: Translate = (key, values) => english(key as never, values as never);

export class AppError extends Error {
  readonly key: string;
  readonly values?: Record<string, string | number>;
  /** For a 429: how long to wait, sent as Retry-After (src/server/accounts/throttle.ts). */
  retryAfterSeconds?: number;

  constructor(
    readonly code: ErrorCode,
    message: string | ErrorMessage = `errors.${code}`,
    readonly fields?: FieldErrors,
  ) {
    const { key, values } = typeof message === "string" ? { key: message, values: undefined } : message;
    super(inEnglish(key, values));
    this.name = "AppError";
    this.key = key;
    this.values = values;
  }

  get status() {
    return STATUS_FOR_CODE[this.code];
  }

  /** The message in the language of `t`. */
  say(t: Translate): string {
    return t(this.key, this.values);
  }
}

export const unauthenticated = () => new AppError("unauthenticated");
export const forbidden = (message: string | ErrorMessage = "errors.forbidden") => new AppError("forbidden", message);
export const notFound = (message: string | ErrorMessage = "errors.not_found") => new AppError("not_found", message);
export const invalid = (fields: FieldErrors, message: string | ErrorMessage = "errors.invalid") => new AppError("invalid", message, fields);
