import "server-only";
import { eq } from "drizzle-orm";
import { signInThrottle } from "@/db/schema";
import { getDb } from "../platform/db";
import { AppError } from "../platform/errors";

/**
 * Counters of failed or costly attempts, one row per key; a key takes no attempt before its
 * `blocked_until`. Every check and count is a synchronous read and write on the one
 * connection, so two requests cannot interleave between them.
 */

export const THROTTLE_WINDOW_MS = 15 * 60 * 1000;
/** Attempts one key may make in a 15-minute window; then it waits for the window's end. */
export const WINDOW_LIMITS = {
  // Failed sign-ins from one client to any address: password spraying.
  client: 30,
  // Reset links to one address (a mailbox is not to be flooded), and asked for by one client.
  resetEmail: 3,
  resetClient: 20,
  // Set-password attempts from one client with a link that does not work.
  linkClient: 10,
} as const;
export type WindowScope = keyof typeof WINDOW_LIMITS;

/**
 * Failed sign-ins on one account FROM ONE CLIENT: five are free, then each further one makes
 * that client wait twice as long as the last (2, 4, 8 … seconds, at most 15 minutes). Other
 * clients are not held back, so nobody can lock a colleague out by guessing wrong on purpose.
 * A run is forgotten after a day without failures, or when that client signs in.
 */
export const FREE_FAILURES = 5;
export const MAX_DELAY_S = 15 * 60;
export const FORGET_AFTER_MS = 24 * 60 * 60 * 1000;
export const delaySeconds = (failures: number): number => (failures < FREE_FAILURES ? 0 : Math.min(2 ** (failures - FREE_FAILURES + 1), MAX_DELAY_S));

const accountKey = (email: string, client: string) => `account:${email.toLowerCase()}|${client}`;
const windowKey = (scope: WindowScope, value: string) => `${scope}:${value.toLowerCase()}`;

function waitMs(key: string, now: number): number {
  const row = getDb().select({ blockedUntil: signInThrottle.blockedUntil }).from(signInThrottle).where(eq(signInThrottle.key, key)).get();
  return row?.blockedUntil ? Math.max(0, row.blockedUntil.getTime() - now) : 0;
}

/** Adds one to a key's count; `sliding` runs restart from each attempt, fixed ones from the first. */
function bump(key: string, now: number, run: { lastsMs: number; sliding: boolean; blockedUntil: (count: number, startedAt: number) => number | null }) {
  const db = getDb();
  const row = db.select().from(signInThrottle).where(eq(signInThrottle.key, key)).get();
  const fresh = !row || now - row.windowStartedAt.getTime() > run.lastsMs;
  const failures = fresh ? 1 : row.failures + 1;
  const startedAt = fresh || run.sliding ? now : row.windowStartedAt.getTime();
  const until = run.blockedUntil(failures, startedAt);
  const values = { failures, windowStartedAt: new Date(startedAt), blockedUntil: until === null ? null : new Date(until) };
  db.insert(signInThrottle).values({ key, ...values }).onConflictDoUpdate({ target: signInThrottle.key, set: values }).run();
}

const windowRun = (scope: WindowScope) => ({
  lastsMs: THROTTLE_WINDOW_MS,
  sliding: false,
  blockedUntil: (count: number, startedAt: number) => (count >= WINDOW_LIMITS[scope] ? startedAt + THROTTLE_WINDOW_MS : null),
});

/** How long this client must wait before trying this address again (0: it may try now). */
export function signInWaitMs(email: string, client: string, now = Date.now()): number {
  return Math.max(waitMs(accountKey(email, client), now), waitMs(windowKey("client", client), now));
}

export function recordSignInFailure(email: string, client: string, now = Date.now()): void {
  bump(accountKey(email, client), now, { lastsMs: FORGET_AFTER_MS, sliding: true, blockedUntil: (count) => (delaySeconds(count) ? now + delaySeconds(count) * 1000 : null) });
  bump(windowKey("client", client), now, windowRun("client"));
}

/** A sign-in that worked forgets that client's failures on that account (not anyone else's). */
export function clearSignInFailures(email: string, client: string): void {
  getDb().delete(signInThrottle).where(eq(signInThrottle.key, accountKey(email, client))).run();
}

export function attemptWaitMs(scope: WindowScope, value: string, now = Date.now()): number {
  return waitMs(windowKey(scope, value), now);
}

export function countAttempt(scope: WindowScope, value: string, now = Date.now()): void {
  bump(windowKey(scope, value), now, windowRun(scope));
}

/**
 * The 429 for a wait: the API sends the seconds as Retry-After (RFC 9110 §10.2.3), and the
 * message says them, in minutes from two minutes on.
 */
export function mustWait(ms: number, key = "errors.waitBeforeRetry"): AppError {
  const seconds = Math.max(1, Math.ceil(ms / 1000));
  const error = new AppError("rate_limited", { key, values: { seconds, minutes: seconds < 120 ? 0 : Math.ceil(seconds / 60) } });
  error.retryAfterSeconds = seconds;
  return error;
}
