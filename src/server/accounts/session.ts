import "server-only";
import { parse as parseCookies } from "cookie";
import { cookies, headers } from "next/headers";
import { cache } from "react";
import type { Session } from "lucia";
import type { Role } from "@/domain/roles";
import type { Locale } from "@/i18n/locale";
import { can, type Actor, type Permission } from "@/domain/permissions";
import { lucia } from "./auth";
import { forbidden, unauthenticated } from "../platform/errors";
import { publicOriginIsHttps } from "../platform/public-origin";
import { outlivedSession, sessionIdFor } from "./session-token";

/** `locale` is the person's own language setting (null: follow the browser), read with the session at no extra cost. */
export type SessionUser = Actor & { email: string; name: string; locale?: Locale | null };

type Validated = { user: SessionUser; session: Session } | null;

/** The cookie's token → its session, refused when disabled or past its absolute lifetime. */
async function validate(token: string | null): Promise<Validated & { fresh?: boolean } | null> {
  if (!token) return null;
  const { user, session } = await lucia().validateSession(sessionIdFor(token));
  if (!user || !session || user.disabledAt) return null;
  if (outlivedSession(session)) {
    await lucia().invalidateSession(session.id);
    return null;
  }
  return {
    user: { id: user.id, email: user.email, name: user.name, role: user.role as Role, partyId: user.partyId, locale: user.locale },
    session,
    fresh: session.fresh,
  };
}

/**
 * For route handlers: reads the session from the request's own Cookie header, with the
 * `cookie` package's parser (several times faster than lucia's on every API request; a
 * malformed escape is left as it came, and so matches no session).
 */
export function sessionFromRequest(request: { headers: { get(name: string): string | null } }) {
  const header = request.headers.get("cookie");
  return validate(header ? (parseCookies(header)[lucia().sessionCookieName] ?? null) : null);
}

/**
 * Whether the session cookie is marked Secure: always when the public origin is https, and
 * when this request says it came over https. Trusting X-Forwarded-Proto here cannot hurt: a
 * forged one only keeps the sender's own cookie off plain http.
 */
export function isHttps(request: { url: string; headers: Headers }): boolean {
  if (publicOriginIsHttps()) return true;
  const forwarded = request.headers.get("x-forwarded-proto");
  if (forwarded) return forwarded.split(",")[0]!.trim() === "https";
  return new URL(request.url).protocol === "https:";
}

/** A Set-Cookie value for a new or refreshed session (its token), Secure when served over https. */
export function sessionCookieHeader(token: string, secure: boolean): string {
  const c = lucia().createSessionCookie(token);
  c.attributes.secure = secure;
  return c.serialize();
}

export function blankSessionCookieHeader(secure: boolean): string {
  const c = lucia().createBlankSessionCookie();
  c.attributes.secure = secure;
  return c.serialize();
}

/** For pages, layouts and server actions: the signed-in user of this request, or null. */
export const currentUser = cache(async (): Promise<SessionUser | null> => {
  const jar = await cookies();
  const result = await validate(jar.get(lucia().sessionCookieName)?.value ?? null);
  return result?.user ?? null;
});

export async function requireUser(): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) throw unauthenticated();
  return user;
}

export async function requirePermission(permission: Permission): Promise<SessionUser> {
  const user = await requireUser();
  if (!can(user, permission)) throw forbidden();
  return user;
}

/** Whether this page request arrived over https (for the Secure cookie flag in actions). */
export async function requestIsHttps(): Promise<boolean> {
  if (publicOriginIsHttps()) return true;
  const h = await headers();
  const proto = h.get("x-forwarded-proto");
  return proto ? proto.split(",")[0]!.trim() === "https" : false;
}
