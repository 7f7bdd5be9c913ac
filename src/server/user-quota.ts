import "server-only";
import { AppError } from "./errors";

type Limits = { atOnce: number; perMinute: number; busy: string; tooMany: string };
const MINUTE_MS = 60_000;

/**
 * How much of a costly request each user may run: so many at once and so many a minute, in
 * this process's memory (one server process; a restart forgets, which costs nothing here).
 * Over either limit the answer is 429 (RFC 6585 §4) with the catalogue's words.
 */
export class UserQuota {
  private readonly running = new Map<string, number>();
  private readonly started = new Map<string, number[]>();

  constructor(private readonly limits: Limits) {}

  /** Takes a turn for the user, or throws; the returned function gives the turn back. */
  take(userId: string, now = Date.now()): () => void {
    const recent = (this.started.get(userId) ?? []).filter((at) => now - at < MINUTE_MS);
    if ((this.running.get(userId) ?? 0) >= this.limits.atOnce) throw new AppError("rate_limited", this.limits.busy);
    if (recent.length >= this.limits.perMinute) throw new AppError("rate_limited", { key: this.limits.tooMany, values: { count: recent.length } });
    this.started.set(userId, [...recent, now]);
    this.running.set(userId, (this.running.get(userId) ?? 0) + 1);
    let given = false;
    return () => {
      if (given) return;
      given = true;
      const left = this.running.get(userId)! - 1;
      if (left > 0) this.running.set(userId, left);
      else this.running.delete(userId);
    };
  }
}
