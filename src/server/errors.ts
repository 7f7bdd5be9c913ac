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

export class AppError extends Error {
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly fields?: FieldErrors,
  ) {
    super(message);
    this.name = "AppError";
  }

  get status() {
    return STATUS_FOR_CODE[this.code];
  }
}

export const unauthenticated = () => new AppError("unauthenticated", "Sign in to continue.");
export const forbidden = (message = "Your role does not allow this.") => new AppError("forbidden", message);
export const notFound = (what = "That record") => new AppError("not_found", `${what} was not found.`);
export const invalid = (fields: FieldErrors, message = "Some fields need correcting.") =>
  new AppError("invalid", message, fields);
