import { can, type Actor } from "./permissions";
import { PARTY_KIND_FOR_ROLE } from "./roles";

/**
 * Who answers for a party's records. The brewery's office is its admin (records:correct); a
 * grower's or a mill's own staff (grower, miller) are their party's office, as those parties
 * have no separate office role. The brewery's floor staff, sales and auditors are not.
 */
export function isOfficeOf(actor: Actor | null, partyId: string): boolean {
  if (!actor || actor.partyId !== partyId) return false;
  return PARTY_KIND_FOR_ROLE[actor.role] !== "brewery" || can(actor, "records:correct");
}

/** The event as a correction judges it: who recorded it, for which party. */
export type CorrectableEvent = { userId: string; partyId: string };

export type CorrectionRefusal = "errors.notYourEvent" | "errors.movedOnSinceEvent";

/**
 * Why `actor` may not correct `event`, or null if they may. `holders` are the parties holding,
 * now, every lot the event recorded on (drawn, moved, measured or made). Custody is evidence:
 * while those lots are all still with the party that recorded the event, its recorder (or the
 * brewery office) may undo it; once one has moved on, only the office of every party now
 * holding them, or the brewery office — never the party the lot has left.
 */
export function correctionRefusal(actor: Actor | null, event: CorrectableEvent, holders: readonly string[]): CorrectionRefusal | null {
  if (can(actor, "records:correct")) return null;
  if (!actor) return "errors.notYourEvent";
  const movedOn = holders.filter((h) => h !== event.partyId);
  if (movedOn.length === 0) return actor.id === event.userId ? null : "errors.notYourEvent";
  return holders.every((h) => isOfficeOf(actor, h)) ? null : "errors.movedOnSinceEvent";
}

export const canCorrect = (actor: Actor | null, event: CorrectableEvent, holders: readonly string[]) => correctionRefusal(actor, event, holders) === null;
