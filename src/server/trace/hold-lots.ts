import "server-only";
import { inArray } from "drizzle-orm";
import { z } from "zod";
import { lotHolds, lots } from "@/db/schema";
import { normaliseLotCode } from "@/domain/lot-code";
import { canHoldLots } from "@/domain/permissions";
import { lotCode } from "@/lib/validation/events";
import { recordAudit } from "../records/audit";
import { getDb, writeTransaction } from "../platform/db";
import { AppError, forbidden, notFound } from "../platform/errors";
import { lotByCode } from "../ledger/event-rows";
import { currentHold, currentHolds } from "./holds";
import { loadRecall } from "./recall";
import type { SessionUser } from "../accounts/session";

export const holdSchema = z.object({
  code: lotCode.transform(normaliseLotCode),
  reason: z.string().trim().min(3).max(500),
});
export type HoldInput = z.infer<typeof holdSchema>;

type Target = { id: number; code: string };

/** The lots a recall reached (the recalled lot first), with their ids. */
function reachedLots(actor: SessionUser, code: string): Target[] {
  const recall = loadRecall(actor, code, []); // the lots only: a hold needs no event
  const codes = recall.lots.map((l) => l.code);
  const rows = getDb().select({ id: lots.id, code: lots.code }).from(lots).where(inArray(lots.code, codes)).all();
  const order = new Map(codes.map((c, i) => [c, i]));
  return rows.sort((a, b) => order.get(a.code)! - order.get(b.code)!);
}

function append(actor: SessionUser, targets: Target[], action: "hold" | "release", input: HoldInput, recallCode: string) {
  return writeTransaction((tx) => {
    // Read again inside the write lock: a lot already in the wanted state gets no second row.
    const now = currentHolds(tx, targets.map((l) => l.id));
    const changed = targets.filter((l) => (action === "hold" ? !now.has(l.id) : now.has(l.id)));
    if (!changed.length) return changed;
    const at = new Date();
    tx.insert(lotHolds).values(changed.map((l) => ({ lotId: l.id, action, reason: input.reason, recallCode, userId: actor.id, at }))).run();
    recordAudit(tx, { userId: actor.id, action: action === "hold" ? "lot.held" : "lot.released", subject: input.code, detail: { lots: changed.map((l) => l.code), reason: input.reason, recall: recallCode || undefined } });
    return changed;
  });
}

/** Puts every lot the recall of `code` reached on hold, in one action; lots already held are left as they are. */
export function holdRecall(actor: SessionUser, raw: unknown) {
  if (!canHoldLots(actor)) throw forbidden();
  const input = holdSchema.parse(raw);
  const held = append(actor, reachedLots(actor, input.code), "hold", input, input.code);
  return { held: held.map((l) => l.code) };
}

/** Releases every held lot the recall of `code` reached. */
export function releaseRecall(actor: SessionUser, raw: unknown) {
  if (!canHoldLots(actor)) throw forbidden();
  const input = holdSchema.parse(raw);
  const released = append(actor, reachedLots(actor, input.code), "release", input, input.code);
  return { released: released.map((l) => l.code) };
}

/** Releases one lot; a lot that is not on hold is a conflict (nothing to release). */
export function releaseLot(actor: SessionUser, raw: unknown) {
  if (!canHoldLots(actor)) throw forbidden();
  const input = holdSchema.parse(raw);
  const lot = lotByCode(getDb(), input.code);
  if (!lot) throw notFound({ key: "errors.lotNotFound", values: { code: input.code } });
  if (!currentHold(getDb(), lot.id)) throw new AppError("conflict", { key: "errors.notOnHold", values: { code: lot.code } });
  const released = append(actor, [{ id: lot.id, code: lot.code }], "release", input, "");
  if (!released.length) throw new AppError("conflict", { key: "errors.notOnHold", values: { code: lot.code } });
  return { released: released.map((l) => l.code) };
}
