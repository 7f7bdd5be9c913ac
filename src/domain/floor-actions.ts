import { can, type Actor, type Permission } from "./permissions";
import { FLOOR_ACTIONS, offerFor, STEP_OF_ACTION, type FloorLot, type FloorOffer, type FloorRights } from "./floor-offer";
import { STEP_RULES, type RecordableStep } from "./steps";

// The floor's pure rules (actions by stage, portions, the offer from rights) are in
// floor-offer.ts, which client components import without the permission map.
export * from "./floor-offer";

/** A person's floor rights from their role, for the scan screen (see FloorRights); anyParty is canActOnLot's "lots:act-any". */
export function floorRights(actor: Actor): FloorRights {
  return { partyId: actor.partyId, anyParty: can(actor, "lots:act-any"), actions: FLOOR_ACTIONS.filter((a) => mayRecord(actor, STEP_OF_ACTION[a])) };
}

/** What this person may record on this lot (offerFor with their rights from the role). */
export function floorOffer(actor: Actor, lot: FloorLot): FloorOffer {
  return offerFor(floorRights(actor), lot);
}

export function mayRecord(actor: Actor, step: RecordableStep): boolean {
  const permission: Permission | readonly Permission[] = STEP_RULES[step].permission;
  return (typeof permission === "string" ? [permission] : permission).some((p) => can(actor, p));
}
