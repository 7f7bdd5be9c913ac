// The session check every signed-in request makes: lucia's validateSession over our prepared
// adapter (src/server/session-adapter.ts). Lucia v3's rules (lucia-auth.com, "Sessions"):
// an expired session is refused and deleted; one in the second half of its life is extended.
import Database from "better-sqlite3";
import { eq } from "drizzle-orm";
import { afterAll, describe, expect, it } from "vitest";
import { drizzleOver } from "@/db/client";
import { sessions, users } from "@/db/schema";
import { lucia } from "@/server/auth";
import { databaseFile, getDb } from "@/server/db";
import { PreparedSessionAdapter } from "@/server/session-adapter";
import { sessionFromRequest } from "@/server/session";

const cookieFor = (id: string) => ({ headers: { get: (name: string) => (name === "cookie" ? `${lucia().sessionCookieName}=${id}` : null) } });
const HOUR = 3_600_000;
const logged: string[] = [];
const watched = new Database(databaseFile(), { verbose: (s) => logged.push(String(s)) });
afterAll(() => watched.close());

describe("the per-request session check", () => {
  it("reads the session and the user's attributes, never the password hash", async () => {
    const session = await lucia().createSession("user-brewer", {});
    const adapter = new PreparedSessionAdapter(drizzleOver(watched));
    logged.length = 0;
    const [found, user] = await adapter.getSessionAndUser(session.id);
    expect(logged).toHaveLength(1);
    expect(logged[0]).not.toMatch(/password/i);
    expect(found).toEqual({ id: session.id, userId: "user-brewer", expiresAt: new Date(Math.floor(session.expiresAt.getTime() / 1000) * 1000), attributes: {} }); // stored in whole seconds
    expect(user).toEqual({ id: "user-brewer", attributes: { email: "brewer@example.com", name: expect.any(String), role: "brewer", partyId: expect.any(String), disabledAt: null } });
    expect(await adapter.getSessionAndUser("no-such-session")).toEqual([null, null]);
  });

  it("admits a live session and refuses a disabled user's", async () => {
    const session = await lucia().createSession("user-miller", {});
    expect((await sessionFromRequest(cookieFor(session.id)))?.user).toMatchObject({ id: "user-miller", role: "miller" });
    getDb().update(users).set({ disabledAt: new Date() }).where(eq(users.id, "user-miller")).run();
    try {
      expect(await sessionFromRequest(cookieFor(session.id))).toBeNull();
    } finally {
      getDb().update(users).set({ disabledAt: null }).where(eq(users.id, "user-miller")).run();
    }
  });

  it("refuses and deletes an expired session, and extends one past half its life", async () => {
    const expired = await lucia().createSession("user-brewer", {});
    const ageing = await lucia().createSession("user-brewer", {});
    const setExpiry = (id: string, at: number) => getDb().update(sessions).set({ expiresAt: Math.floor(at / 1000) }).where(eq(sessions.id, id)).run();
    setExpiry(expired.id, Date.now() - 1000);
    setExpiry(ageing.id, Date.now() + HOUR); // 1 h left of a 12 h session
    expect(await sessionFromRequest(cookieFor(expired.id))).toBeNull();
    expect(getDb().select().from(sessions).where(eq(sessions.id, expired.id)).get()).toBeUndefined();
    const refreshed = await sessionFromRequest(cookieFor(ageing.id));
    expect(refreshed?.fresh).toBe(true);
    const stored = getDb().select().from(sessions).where(eq(sessions.id, ageing.id)).get()!;
    expect(stored.expiresAt * 1000).toBeGreaterThan(Date.now() + 11 * HOUR);
  });
});
