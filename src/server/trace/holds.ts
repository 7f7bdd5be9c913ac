import "server-only";
import { desc, eq, sql } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { lotHolds, users } from "@/db/schema";
import type { Translate } from "@/lib/validation/field-errors";
import { getDb } from "../platform/db";
import { AppError } from "../platform/errors";
import { prepared } from "../platform/prepared";

/** A lot's current hold: the newest row of `lot_holds` when that row is a hold. */
export type Hold = { reason: string; at: string; recallCode: string };
export type HoldRow = { id: number; action: "hold" | "release"; reason: string; recallCode: string; at: string; userName: string };

type Latest = { action: "hold" | "release"; reason: string; recallCode: string; at: Date } | undefined;

/** Every step that draws, ships or dispatches asks this: one indexed row per lot (prepared, the floor's hot path). */
export function currentHold(db: DbOrTx, lotId: number): Hold | null {
  const latest = prepared(db, "lot-hold-latest", (d) =>
    d
      .select({ action: lotHolds.action, reason: lotHolds.reason, recallCode: lotHolds.recallCode, at: lotHolds.at })
      .from(lotHolds)
      .where(eq(lotHolds.lotId, sql.placeholder("lotId")))
      .orderBy(desc(lotHolds.id))
      .limit(1)
      .prepare(),
  ).get({ lotId }) as Latest;
  return latest?.action === "hold" ? { reason: latest.reason, at: latest.at.toISOString(), recallCode: latest.recallCode } : null;
}

/**
 * The current holds of many lots at once (a recall reaches hundreds): one statement, the lots
 * named as one JSON list by id or by code, each with only its newest hold row.
 */
function latestHolds(db: DbOrTx, by: "id" | "code", keys: (number | string)[]) {
  const rows = db.all<{ id: number; code: string; action: string; reason: string; recallCode: string; at: number }>(sql`
    select l.id, l.code, h.action, h.reason, h.recall_code as recallCode, h.at
    from lots l join lot_holds h on h.id = (select max(id) from lot_holds where lot_id = l.id)
    where ${by === "id" ? sql`l.id` : sql`l.code`} in (select value from json_each(${JSON.stringify(keys)}))`);
  return rows.filter((r) => r.action === "hold").map((r) => ({ id: r.id, code: r.code, hold: { reason: r.reason, at: new Date(r.at).toISOString(), recallCode: r.recallCode } }));
}

/** The current holds of many lots at once, by lot id (read again inside a hold's write lock). */
export function currentHolds(db: DbOrTx, lotIds: number[]): Map<number, Hold> {
  return new Map(lotIds.length ? latestHolds(db, "id", lotIds).map((r) => [r.id, r.hold]) : []);
}

/** A lot's holds and releases, oldest first, with who recorded each. */
export function holdHistory(db: DbOrTx, lotId: number): HoldRow[] {
  return db
    .select({ id: lotHolds.id, action: lotHolds.action, reason: lotHolds.reason, recallCode: lotHolds.recallCode, at: lotHolds.at, userName: users.name })
    .from(lotHolds)
    .innerJoin(users, eq(users.id, lotHolds.userId))
    .where(eq(lotHolds.lotId, lotId))
    .orderBy(lotHolds.id)
    .all()
    .map((r) => ({ ...r, at: r.at.toISOString() }));
}

/** A held lot is neither drawn, shipped, dispatched nor bottled until released: 409 naming the reason. */
export function refuseIfHeld(db: DbOrTx, lot: { id: number; code: string }, field: string, t: Translate) {
  const hold = currentHold(db, lot.id);
  if (!hold) return;
  const values = { code: lot.code, reason: hold.reason };
  throw new AppError("conflict", { key: "errors.onHold", values }, { [field]: [t("errors.onHold", values)] });
}

/** Current holds by lot code (pages that list lots by code: the recall). */
export function holdsByCode(db: DbOrTx, codes: string[]): Map<string, Hold> {
  return new Map(codes.length ? latestHolds(db, "code", codes).map((r) => [r.code, r.hold]) : []);
}

/** The same, on the server's own connection: for pages. */
export const heldLots = (codes: string[]) => holdsByCode(getDb(), codes);

/** What the lot page shows: the current hold, if any, and every hold and release. */
export function lotHoldState(lotId: number) {
  return { hold: currentHold(getDb(), lotId), history: holdHistory(getDb(), lotId) };
}
