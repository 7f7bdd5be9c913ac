import "server-only";
import { z } from "zod";
import { LOCALE_COOKIE, pickLocale, type Locale } from "@/i18n/locale";
import { translator } from "@/i18n/messages";
import { fieldErrorsFrom, type Translate } from "@/lib/validation/field-errors";
import { clientAddress } from "./client-address";
import { AppError, forbidden, invalid, unauthenticated } from "./errors";
import { sessionFromRequest, type SessionUser } from "../accounts/session";
import { can, type Permission } from "@/domain/permissions";

export type RouteContext = { params: Record<string, string>; t: Translate };
type NextContext = { params?: Promise<Record<string, string | string[]>> };

/** What a JSON route reads of its request: the part of a Web Request the helpers below need. */
export type ApiRequest = {
  readonly method: string;
  readonly url: string;
  readonly headers: { get(name: string): string | null };
  json(): Promise<unknown>;
};

/** A JSON route's answer before it becomes a Response. */
export type JsonReply = { status: number; body: unknown };
export const reply = (body: unknown, status = 200): JsonReply => ({ status, body });

/** Translators by locale cookie and Accept-Language value: a site sees a handful, and every API request needs one. */
const apiTranslators = new Map<string, Translate>();
const byLocale = new Map<Locale, Translate>();
const MAX_REMEMBERED_HEADERS = 100;
// Only the language cookie is wanted here, so a pattern rather than parsing every cookie of every request.
const LOCALE_COOKIE_PATTERN = new RegExp(`(?:^|;)\\s*${LOCALE_COOKIE}=([a-z]{2})(?:;|\\s|$)`);

/** The API's language: the language switch's cookie, then Accept-Language, then Japanese (no session read: it must stay cheap). */
export function translatorFor(request: Pick<ApiRequest, "headers">): Translate {
  const cookie = LOCALE_COOKIE_PATTERN.exec(request.headers.get("cookie") ?? "")?.[1];
  const header = request.headers.get("accept-language") ?? "";
  const rememberAs = `${cookie ?? ""}|${header}`;
  let translate = apiTranslators.get(rememberAs);
  if (translate) return translate;
  const locale = pickLocale(cookie, header);
  translate = byLocale.get(locale);
  if (!translate) {
    const t = translator(locale);
    byLocale.set(locale, (translate = (key, values) => t(key as never, values as never)));
  }
  // Bounded: a client sending a new header each time must not grow the map.
  if (apiTranslators.size < MAX_REMEMBERED_HEADERS) apiTranslators.set(rememberAs, translate);
  return translate;
}

async function paramsOf(context?: NextContext): Promise<Record<string, string>> {
  const raw = (await context?.params) ?? {};
  return Object.fromEntries(Object.entries(raw).map(([k, v]) => [k, Array.isArray(v) ? v.join("/") : v]));
}

/**
 * Wraps a route handler: refuses cross-origin writes, turns application and validation
 * errors into the API's error shape, and never leaks internals on a 500.
 */
export function handle(fn: (request: Request, ctx: RouteContext) => Promise<Response>) {
  return async (request: Request, context?: NextContext): Promise<Response> => {
    const t = translatorFor(request);
    try {
      if (!["GET", "HEAD", "OPTIONS"].includes(request.method)) checkOrigin(request);
      return await fn(request, { params: await paramsOf(context), t });
    } catch (error) {
      return errorResponse(error, t);
    }
  };
}

/** `handle` for routes that answer JSON: the handler returns its status and body, errors become the API's error shape. */
export function jsonRoute(fn: (request: ApiRequest, ctx: RouteContext) => Promise<JsonReply>) {
  return async (request: Request, context?: NextContext): Promise<Response> => {
    const t = translatorFor(request);
    let result: JsonReply;
    try {
      if (!["GET", "HEAD", "OPTIONS"].includes(request.method)) checkOrigin(request);
      result = await fn(request, { params: await paramsOf(context), t });
    } catch (error) {
      result = errorReply(error, t);
    }
    return Response.json(result.body, { status: result.status });
  };
}

export function errorResponse(error: unknown, t: Translate): Response {
  const { status, body } = errorReply(error, t);
  const wait = error instanceof AppError ? error.retryAfterSeconds : undefined;
  return Response.json(body, { status, headers: wait ? { "Retry-After": String(wait) } : undefined });
}

export function errorReply(error: unknown, t: Translate): JsonReply {
  if (error instanceof z.ZodError) error = invalid(fieldErrorsFrom(error, t));
  if (error instanceof AppError) {
    return reply({ error: { code: error.code, message: error.say(t), ...(error.fields ? { fields: error.fields } : {}) } }, error.status);
  }
  console.error(error);
  return reply({ error: { code: "internal", message: t("errors.internal") } }, 500);
}

/**
 * Browsers send Origin on every non-GET request; a mismatch means another site is
 * posting on the user's behalf. Requests with no browser headers (integrations) pass.
 */
export function checkOrigin(request: Pick<ApiRequest, "headers" | "url">): void {
  const origin = request.headers.get("origin");
  const host = request.headers.get("x-forwarded-host") ?? request.headers.get("host") ?? new URL(request.url).host;
  if (origin) {
    let originHost: string;
    try {
      originHost = new URL(origin).host;
    } catch {
      throw forbidden("errors.crossOrigin");
    }
    if (originHost !== host) throw forbidden("errors.crossOrigin");
    return;
  }
  const site = request.headers.get("sec-fetch-site");
  if (site && site !== "same-origin" && site !== "none") throw forbidden("errors.crossOrigin");
}

/** Parses a JSON body with a zod schema; malformed JSON and wrong shapes are both 422. */
export async function readJson<S extends z.ZodType>(request: Pick<ApiRequest, "json">, schema: S, t: Translate): Promise<z.infer<S>> {
  let body: unknown;
  try {
    body = await request.json();
  } catch {
    throw invalid({ _: [t("validation.malformedJson")] }, "errors.malformedJson");
  }
  const parsed = schema.safeParse(body);
  if (!parsed.success) throw invalid(fieldErrorsFrom(parsed.error, t));
  return parsed.data;
}

export async function requireApiUser(request: Pick<ApiRequest, "headers">): Promise<SessionUser> {
  const found = await sessionFromRequest(request);
  if (!found) throw unauthenticated();
  return found.user;
}

export async function requireApiPermission(request: Pick<ApiRequest, "headers">, permission: Permission): Promise<SessionUser> {
  const user = await requireApiUser(request);
  if (!can(user, permission)) throw forbidden();
  return user;
}

/** The client's address for sign-in throttling (src/server/platform/client-address.ts). */
export function clientKey(request: Pick<ApiRequest, "headers">): string {
  return clientAddress(request.headers);
}

/** The floor's retry key: printable, at most 200 characters; anything else is ignored. */
export function idempotencyKeyOf(request: Pick<ApiRequest, "headers">): string | null {
  const key = request.headers.get("idempotency-key")?.trim();
  return key && key.length <= 200 && /^[\x21-\x7e]+$/.test(key) ? key : null;
}
