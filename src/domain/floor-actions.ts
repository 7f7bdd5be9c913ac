import type { LotKind } from "./steps";

/**
 * What the floor offers after a scan, by the stage a lot is at. Each action is a floor
 * screen at /floor/{action}?lot={code}.
 */
export const FLOOR_ACTIONS = ["soak", "steam", "split", "koji-check", "koji", "starter", "add", "measure", "press", "blend", "bottle"] as const;
export type FloorAction = (typeof FLOOR_ACTIONS)[number];

export function actionsFor(kind: LotKind, attributes: Record<string, unknown> = {}): FloorAction[] {
  switch (kind) {
    case "polished":
      return ["soak"];
    case "soaked":
      return ["steam"];
    case "steamed":
      // A portion split for the koji room goes there; other steamed rice is split or added.
      if (attributes.use === "koji") return ["koji-check", "koji"];
      if (attributes.use === "starter") return ["starter"];
      if (attributes.use === "mash") return ["add"];
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

/** Days a polished lot has rested (polished rice is left to settle before soaking; common practice). */
export function daysSince(fromIso: string, now: Date = new Date()): number {
  return Math.floor((now.getTime() - new Date(fromIso).getTime()) / 86_400_000);
}
