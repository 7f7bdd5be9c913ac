// The session check every signed-in request makes: lucia's validateSession over our prepared
// adapter (src/server/accounts/session-adapter.ts). Lucia v3's rules (lucia-auth.com, "Sessions"):
// an expired session is refused and deleted; one in the second half of its life is extended.
import { createHash } from "node:crypto";
import Database from "better-sqlite3";
import { eq } from "drizzle-orm";
import { afterAll, afterEach, describe, expect, it, vi } from "vitest";
import { drizzleOver } from "@/db/client";
import { sessions, users } from "@/db/schema";
import { lucia } from "@/server/accounts/auth";
import { databaseFile, getDb } from "@/server/platform/db";
import { PreparedSessionAdapter } from "@/server/accounts/session-adapter";
import { ABSOLUTE_LIFETIME_S, openSession } from "@/server/accounts/session-token";
import { sessionFromRequest } from "@/server/accounts/session";
import { POST as signInRoute } from "../../app/api/auth/sign-in/route";
import { call, jsonRequest } from "../support/api";

const cookieFor = (token: string) => ({ headers: { get: (name: string) => (name === "cookie" ? `${lucia().sessionCookieName}=${token}` : null) } });
const HOUR = 3_600_000;
const logged: string[] = [];
const watched = new Database(databaseFile(), { verbose: (s) => logged.push(String(s)) });
afterAll(() => watched.close());

describe("the per-request session check", () => {
  it("reads the session and the user's attributes, never the password hash", async () => {
    const { session } = await openSession("user-brewer");
    const adapter = new PreparedSessionAdapter(drizzleOver(watched));
    logged.length = 0;
    const [found, user] = await adapter.getSessionAndUser(session.id);
    expect(logged).toHaveLength(1);
    expect(logged[0]).not.toMatch(/password/i);
    expect(found).toEqual({ id: session.id, userId: "user-brewer", expiresAt: new Date(Math.floor(session.expiresAt.getTime() / 1000) * 1000), attributes: { signedInAt: session.signedInAt } }); // stored in whole seconds
    expect(user).toEqual({ id: "user-brewer", attributes: { email: "brewer@example.com", name: expect.any(String), role: "brewer", partyId: expect.any(String), disabledAt: null, locale: null } });
    expect(await adapter.getSessionAndUser("no-such-session")).toEqual([null, null]);
  });

  it("admits a live session and refuses a disabled user's", async () => {
    const { token } = await openSession("user-miller");
    expect((await sessionFromRequest(cookieFor(token)))?.user).toMatchObject({ id: "user-miller", role: "miller" });
    getDb().update(users).set({ disabledAt: new Date() }).where(eq(users.id, "user-miller")).run();
    try {
      expect(await sessionFromRequest(cookieFor(token))).toBeNull();
    } finally {
      getDb().update(users).set({ disabledAt: null }).where(eq(users.id, "user-miller")).run();
    }
  });

  it("refuses and deletes an expired session, and extends one past half its life", async () => {
    const expired = await openSession("user-brewer");
    const ageing = await openSession("user-brewer");
    const setExpiry = (id: string, at: number) => getDb().update(sessions).set({ expiresAt: Math.floor(at / 1000) }).where(eq(sessions.id, id)).run();
    setExpiry(expired.session.id, Date.now() - 1000);
    setExpiry(ageing.session.id, Date.now() + HOUR); // 1 h left of a 12 h session
    expect(await sessionFromRequest(cookieFor(expired.token))).toBeNull();
    expect(getDb().select().from(sessions).where(eq(sessions.id, expired.session.id)).get()).toBeUndefined();
    const refreshed = await sessionFromRequest(cookieFor(ageing.token));
    expect(refreshed?.fresh).toBe(true);
    const stored = getDb().select().from(sessions).where(eq(sessions.id, ageing.session.id)).get()!;
    expect(stored.expiresAt * 1000).toBeGreaterThan(Date.now() + 11 * HOUR);
  });
});

describe("session ids and lifetime", () => {
  afterEach(() => vi.useRealTimers());

  // lucia v3's guide ("Sessions", lucia-auth.com): the id stored is the SHA-256 of the cookie's token, in hex.
  it("stores the SHA-256 of the cookie's token as the id, never the token", async () => {
    const signIn = await call(signInRoute, jsonRequest("/api/auth/sign-in", { body: { email: "sales@example.com", password: "grainline-demo" } }));
    const token = /^grainline_session=([^;]+)/.exec(signIn.headers.get("set-cookie")!)![1]!;
    const rows = getDb().select().from(sessions).where(eq(sessions.userId, "user-sales")).all();
    expect(rows).toHaveLength(1);
    expect(rows[0]!.id).not.toBe(token);
    expect(rows[0]!.id).toBe(createHash("sha256").update(token).digest("hex"));
    // What a leaked table holds is no cookie: sending the stored id back signs nobody in.
    expect(await sessionFromRequest(cookieFor(rows[0]!.id))).toBeNull();
    expect((await sessionFromRequest(cookieFor(token)))?.user.id).toBe("user-sales");
  });

  it("ends a session 30 days after sign-in however active it stayed", async () => {
    const start = new Date("2026-11-01T08:00:00+09:00").getTime();
    vi.useFakeTimers({ toFake: ["Date"], now: start });
    const { token, session } = await openSession("user-auditor");
    expect(ABSOLUTE_LIFETIME_S).toBe(30 * 24 * 3600);
    // In use every 11 hours: lucia's 12-hour idle expiry alone would keep it alive for ever.
    for (let at = start; at < start + ABSOLUTE_LIFETIME_S * 1000 - 11 * HOUR; at += 11 * HOUR) {
      vi.setSystemTime(at);
      expect((await sessionFromRequest(cookieFor(token)))?.user.id).toBe("user-auditor");
    }
    vi.setSystemTime(start + ABSOLUTE_LIFETIME_S * 1000);
    expect(await sessionFromRequest(cookieFor(token))).toBeNull();
    expect(getDb().select().from(sessions).where(eq(sessions.id, session.id)).get()).toBeUndefined();
  });
});
