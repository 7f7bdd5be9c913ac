import "server-only";
import { eq, inArray } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { eventInputs, eventOutputs, lots } from "@/db/schema";
import { correctionRefusal, type CorrectableEvent, type CorrectionRefusal } from "@/domain/corrections";
import { can, canSeeLot } from "@/domain/permissions";
import { getDb } from "../platform/db";
import type { SessionUser } from "../accounts/session";

type LotOfEvent = { eventId: number; partyId: string; originPartyId: string; inTransitTo: string | null };
const columns = { partyId: lots.partyId, originPartyId: lots.originPartyId, inTransitTo: lots.inTransitTo };

/** Every lot each event recorded on (drawn, moved, dispatched, measured or made), as it stands now. */
function lotsOf(tx: DbOrTx, eventIds: number[]): Map<number, LotOfEvent[]> {
  const out = new Map<number, LotOfEvent[]>(eventIds.map((id) => [id, []]));
  if (eventIds.length === 0) return out;
  const rows = [
    ...tx.select({ eventId: eventInputs.eventId, ...columns }).from(eventInputs).innerJoin(lots, eq(lots.id, eventInputs.lotId)).where(inArray(eventInputs.eventId, eventIds)).all(),
    ...tx.select({ eventId: eventOutputs.eventId, ...columns }).from(eventOutputs).innerJoin(lots, eq(lots.id, eventOutputs.lotId)).where(inArray(eventOutputs.eventId, eventIds)).all(),
  ];
  for (const row of rows) out.get(row.eventId)!.push(row);
  return out;
}

const holdersOf = (touched: LotOfEvent[]) => [...new Set(touched.map((l) => l.partyId))];

/**
 * Whether an event exists as far as this user can tell: roles that read all records see every
 * event, others those their party recorded and those on a lot they may see (the lot page's rule).
 * An event outside it answers as unknown, never as forbidden.
 */
export function canSeeEvent(tx: DbOrTx, actor: SessionUser, event: CorrectableEvent & { id: number }): boolean {
  if (can(actor, "records:read-all") || event.partyId === actor.partyId) return true;
  return lotsOf(tx, [event.id]).get(event.id)!.some((lot) => canSeeLot(actor, lot));
}

/** Why `actor` may not correct this event now (src/domain/corrections.ts), or null. */
export function refusalToCorrect(tx: DbOrTx, actor: SessionUser, event: CorrectableEvent & { id: number }): CorrectionRefusal | null {
  return correctionRefusal(actor, event, holdersOf(lotsOf(tx, [event.id]).get(event.id)!));
}

/** Of these events (as a lot page lists them), the ids `actor` may correct: what the correction form offers. */
export function correctableIds(actor: SessionUser, events: (CorrectableEvent & { id: number })[], tx: DbOrTx = getDb()): Set<number> {
  const touched = lotsOf(tx, events.map((e) => e.id));
  return new Set(events.filter((e) => correctionRefusal(actor, e, holdersOf(touched.get(e.id)!)) === null).map((e) => e.id));
}
