import type { LotKind, RecordableStep } from "./steps";

/**
 * What the floor offers after a scan, by the stage a lot is at. Each action is a floor
 * screen at /floor/{action}?lot={code}.
 */
export const FLOOR_ACTIONS = ["soak", "steam", "split", "koji-check", "koji", "starter", "add", "measure", "press", "blend", "bottle"] as const;
export type FloorAction = (typeof FLOOR_ACTIONS)[number];

/** The event each floor screen records (../shared/api.md steps). */
export const STEP_OF_ACTION: Record<FloorAction, RecordableStep> = {
  soak: "soaking",
  steam: "steaming",
  split: "splitting",
  "koji-check": "measuring",
  koji: "koji-making",
  starter: "starter",
  add: "mash-addition",
  measure: "measuring",
  press: "pressing",
  blend: "blending",
  bottle: "bottling",
};

/** The next likely step comes first: the floor's result screen offers it as one tap. */
export function actionsFor(kind: LotKind, attributes: Record<string, unknown> = {}): FloorAction[] {
  switch (kind) {
    case "polished":
      return ["soak"];
    case "soaked":
      return ["steam"];
    case "steamed":
      // Steamed rice can always be split again (koji, starter, each mash addition); a portion
      // already meant for one use offers that use first. Mash rice not yet portioned per
      // addition is split first (three additions, common practice).
      if (attributes.use === "koji") return ["koji-check", "koji", "split"];
      if (attributes.use === "starter") return ["starter", "split"];
      if (attributes.use === "mash") return attributes.addition ? ["add", "split"] : ["split", "add"];
      return ["split", "koji-check", "koji", "starter", "add"];
    case "koji":
      return ["starter", "add"];
    case "starter":
      return ["add"];
    case "tank":
      return ["add", "measure", "press"];
    case "sake":
    case "blend":
      return ["bottle", "blend"];
    default:
      return [];
  }
}

/** What a portion of rice is for: its addition for mash rice, else its use (null when mixed). */
export function portionOf(attributes: Record<string, unknown>): "koji" | "starter" | "mash" | "first" | "middle" | "final" | null {
  if (attributes.use === "mash") return attributes.addition === "first" || attributes.addition === "middle" || attributes.addition === "final" ? attributes.addition : "mash";
  return attributes.use === "koji" || attributes.use === "starter" ? attributes.use : null;
}

export type FloorLot = { kind: string; attributes: Record<string, unknown>; party: { id: string; name: string }; inTransitTo?: { id: string; name: string }; hold?: unknown };
export type FloorOffer = { state: "actions"; actions: FloorAction[] } | { state: "in-transit"; to: string } | { state: "held-elsewhere"; by: string };

/**
 * What a person may do on the floor, worked out on the server from their role (the role →
 * permission map and the step rules stay there): their party, whether they act on any
 * party's lots, and the floor actions whose step they may record. The scan screen gets only
 * this, so the phone is not sent the whole permission map.
 */
export type FloorRights = { partyId: string; anyParty: boolean; actions: FloorAction[] };

/**
 * What this person may record on this lot: nothing is drawn from a lot on its way to another
 * party, only the holder (or the office) acts on a lot, and a role sees only the steps it may
 * record (the same rules the server enforces in src/server/ledger/events.ts).
 */
export function offerFor(rights: FloorRights, lot: FloorLot): FloorOffer {
  if (lot.inTransitTo) return { state: "in-transit", to: lot.inTransitTo.name };
  if (!rights.anyParty && rights.partyId !== lot.party.id) return { state: "held-elsewhere", by: lot.party.name };
  // A lot on hold is drawn, shipped or bottled by no one until released; readings still go on.
  const allowed = (a: FloorAction) => rights.actions.includes(a) && (!lot.hold || STEP_OF_ACTION[a] === "measuring");
  return { state: "actions", actions: actionsFor(lot.kind as LotKind, lot.attributes).filter(allowed) };
}

/** Days a polished lot has rested (polished rice is left to settle before soaking; common practice). */
export function daysSince(fromIso: string, now: Date = new Date()): number {
  return Math.floor((now.getTime() - new Date(fromIso).getTime()) / 86_400_000);
}
