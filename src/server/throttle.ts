import "server-only";
import { eq, sql } from "drizzle-orm";
import { signInThrottle } from "@/db/schema";
import { getDb } from "./db";

export const THROTTLE_WINDOW_MS = 15 * 60 * 1000;
/** Failed attempts allowed in one window: per e-mail address, and per client address. */
export const LIMITS = { email: 5, client: 30 } as const;

type Scope = keyof typeof LIMITS;
const keyFor = (scope: Scope, value: string) => `${scope}:${value.toLowerCase()}`;

function failuresIn(key: string, now: number): number {
  const row = getDb().select().from(signInThrottle).where(eq(signInThrottle.key, key)).get();
  if (!row || now - row.windowStartedAt.getTime() > THROTTLE_WINDOW_MS) return 0;
  return row.failures;
}

/** True when either the address or the client has used up its attempts for now. */
export function isThrottled(email: string, client: string, now = Date.now()): boolean {
  return (
    failuresIn(keyFor("email", email), now) >= LIMITS.email ||
    failuresIn(keyFor("client", client), now) >= LIMITS.client
  );
}

export function recordFailure(email: string, client: string, now = Date.now()): void {
  const db = getDb();
  for (const key of [keyFor("email", email), keyFor("client", client)]) {
    const windowStart = now - THROTTLE_WINDOW_MS;
    db.insert(signInThrottle)
      .values({ key, failures: 1, windowStartedAt: new Date(now) })
      .onConflictDoUpdate({
        target: signInThrottle.key,
        set: {
          failures: sql`case when ${signInThrottle.windowStartedAt} < ${windowStart} then 1 else ${signInThrottle.failures} + 1 end`,
          windowStartedAt: sql`case when ${signInThrottle.windowStartedAt} < ${windowStart} then ${now} else ${signInThrottle.windowStartedAt} end`,
        },
      })
      .run();
  }
}

export function clearFailures(email: string): void {
  getDb().delete(signInThrottle).where(eq(signInThrottle.key, keyFor("email", email))).run();
}
