import "server-only";
import type { Session } from "lucia";
import { lucia } from "./auth";
import { hashLinkToken, newLinkToken } from "./tokens";

/**
 * Sessions in the shape lucia v3's guide recommends ("Sessions", lucia-auth.com): the cookie
 * carries a random token (256 bits here), the sessions table only its SHA-256 in hex as the id.
 * Whoever reads the table (a backup, a leaked copy) holds no cookie that signs anyone in.
 */
export const sessionIdFor = (token: string): string => hashLinkToken(token);

/**
 * However active, a session ends this long after its sign-in: 30 days. Lucia's own expiry
 * (12 hours idle, src/server/accounts/auth.ts) ends a forgotten one sooner; this ends a phone left
 * signed in on the floor that is used every day.
 */
export const ABSOLUTE_LIFETIME_S = 30 * 24 * 60 * 60;

/** Opens a session for the user: the token goes in the cookie, never into the database. */
export async function openSession(userId: string, now = Date.now()): Promise<{ token: string; session: Session }> {
  const { token, hash } = newLinkToken();
  const session = await lucia().createSession(userId, { signedInAt: Math.floor(now / 1000) }, { sessionId: hash });
  return { token, session };
}

export function outlivedSession(session: Pick<Session, "signedInAt">, now = Date.now()): boolean {
  return Math.floor(now / 1000) - session.signedInAt >= ABSOLUTE_LIFETIME_S;
}
