import "server-only";
import { AppError } from "../platform/errors";

type Limits = { atOnce: number; perMinute: number; busy: string; tooMany: string };
const MINUTE_MS = 60_000;

/**
 * How much of a costly request each user may run: so many at once, and so much work (in the
 * caller's unit, e.g. rows) a minute. Kept in this process's memory: there is one server
 * process, and a restart forgetting it costs nothing. Over either limit the answer is 429
 * (RFC 6585 §4) in the catalogue's words.
 */
export class UserQuota {
  private readonly running = new Map<string, number>();
  private readonly spent = new Map<string, { at: number; cost: number }[]>();

  constructor(private readonly limits: Limits) {}

  /** Takes a turn for the user, or throws; `release` gives it back, `charge` counts its work. */
  take(userId: string, now = Date.now()) {
    if ((this.running.get(userId) ?? 0) >= this.limits.atOnce) throw new AppError("rate_limited", this.limits.busy);
    this.refuseOver(userId, 0, now);
    this.running.set(userId, (this.running.get(userId) ?? 0) + 1);
    let released = false;
    return {
      /** Records `cost` against the minute, or throws if it would pass the limit (then nothing is recorded). */
      charge: (cost: number, at = Date.now()) => {
        this.refuseOver(userId, cost, at);
        this.spent.set(userId, [...this.recent(userId, at), { at, cost }]);
      },
      release: () => {
        if (released) return;
        released = true;
        const left = this.running.get(userId)! - 1;
        if (left > 0) this.running.set(userId, left);
        else this.running.delete(userId);
      },
    };
  }

  private recent(userId: string, now: number) {
    return (this.spent.get(userId) ?? []).filter((entry) => now - entry.at < MINUTE_MS);
  }

  private refuseOver(userId: string, cost: number, now: number) {
    const used = this.recent(userId, now).reduce((sum, entry) => sum + entry.cost, 0);
    // At the limit even a turn of no cost is refused; below it, one turn may take what is left.
    if (used >= this.limits.perMinute || used + cost > this.limits.perMinute) {
      throw new AppError("rate_limited", { key: this.limits.tooMany, values: { count: used, limit: this.limits.perMinute } });
    }
  }
}
