import { describe, expect, it } from "vitest";
import { actionsFor, daysSince, floorOffer, floorRights, offerFor, portionOf, STEP_OF_ACTION, type FloorAction, type FloorLot, type FloorOffer } from "./floor-actions";
import { can, canActOnLot, type Actor } from "./permissions";
import { ROLES } from "./roles";
import { LOT_KIND_LIST, STEP_RULES, type LotKind } from "./steps";

describe("floor actions by stage (the order of work on a brewery floor, common practice)", () => {
  it("follows the rice from polished to bottle", () => {
    expect(actionsFor("polished")).toEqual(["soak"]);
    expect(actionsFor("soaked")).toEqual(["steam"]);
    expect(actionsFor("tank")).toContain("press");
    expect(actionsFor("sake")).toContain("bottle");
    expect(actionsFor("bottled")).toEqual([]);
    expect(actionsFor("harvest")).toEqual([]);
  });

  it("offers the split on every steamed lot, the lot's own use first", () => {
    expect(actionsFor("steamed", { use: "koji" })).toEqual(["koji-check", "koji", "split"]);
    expect(actionsFor("steamed", { use: "starter" })).toEqual(["starter", "split"]);
    // Mash rice is portioned per addition (first, middle, final) before it goes in.
    expect(actionsFor("steamed", { use: "mash" })).toEqual(["split", "add"]);
    expect(actionsFor("steamed", { use: "mash", addition: "middle" })).toEqual(["add", "split"]);
    expect(actionsFor("steamed", {})[0]).toBe("split");
  });

  it("names what a portion is for: its addition for mash rice, nothing for rice soaked mixed", () => {
    expect(portionOf({ use: "mash", addition: "final" })).toBe("final");
    expect(portionOf({ use: "mash" })).toBe("mash");
    expect(portionOf({ use: "koji" })).toBe("koji");
    expect(portionOf({})).toBeNull();
  });

  it("counts whole days rested", () => {
    expect(daysSince("2026-11-01T10:00:00+09:00", new Date("2026-11-15T09:00:00+09:00"))).toBe(13);
  });
});

describe("what the floor card offers (custody rules of DEVELOPERS.md)", () => {
  const brewer = { id: "u1", role: "brewer" as const, partyId: "brewery" };
  const admin = { id: "u0", role: "admin" as const, partyId: "brewery" };
  const miller = { id: "u2", role: "miller" as const, partyId: "mill" };
  const lot = (partyId: string, extra: object = {}) => ({ kind: "polished", attributes: {}, party: { id: partyId, name: partyId === "mill" ? "Kawabe Mill" : "Brewery" }, ...extra });

  it("offers steps on a lot the brewer's party holds", () => {
    expect(floorOffer(brewer, lot("brewery"))).toEqual({ state: "actions", actions: ["soak"] });
  });

  it("names the holder instead of offering steps on another party's lot", () => {
    expect(floorOffer(brewer, lot("mill"))).toEqual({ state: "held-elsewhere", by: "Kawabe Mill" });
  });

  it("says where a lot in transit is going, even to the office, since nothing is drawn from it", () => {
    const travelling = lot("mill", { inTransitTo: { id: "brewery", name: "Brewery" } });
    expect(floorOffer(brewer, travelling)).toEqual({ state: "in-transit", to: "Brewery" });
    expect(floorOffer(admin, travelling)).toEqual({ state: "in-transit", to: "Brewery" });
  });

  it("a lot on hold offers only readings (the server refuses draws from it: src/server/trace/holds.ts)", () => {
    const tank = { ...lot("brewery"), kind: "tank", hold: { reason: "Residue finding on H26-0003" } };
    expect(floorOffer(brewer, tank)).toEqual({ state: "actions", actions: ["measure"] });
    expect(floorOffer(brewer, { ...tank, hold: undefined })).toEqual({ state: "actions", actions: ["add", "measure", "press"] });
  });

  it("the office acts on any party's lot; a role offers only the steps it may record", () => {
    expect(floorOffer(admin, lot("mill"))).toEqual({ state: "actions", actions: ["soak"] });
    // A miller holding steamed rice may not record brewing steps (src/domain/steps.ts).
    expect(floorOffer(miller, { ...lot("mill"), kind: "steamed" })).toEqual({ state: "actions", actions: ["koji-check"] });
  });
});

describe("the scan screen's rights (computed on the server) offer what the role map offers", () => {
  // The rule as it was before the phone got rights instead of the permission map, written
  // straight from the role map and the step rules: an independent reference.
  const reference = (actor: Actor, lot: FloorLot): FloorOffer => {
    if (lot.inTransitTo) return { state: "in-transit", to: lot.inTransitTo.name };
    if (!canActOnLot(actor, { partyId: lot.party.id })) return { state: "held-elsewhere", by: lot.party.name };
    const may = (a: FloorAction) => [STEP_RULES[STEP_OF_ACTION[a]].permission].flat().some((p) => can(actor, p));
    return { state: "actions", actions: actionsFor(lot.kind as LotKind, lot.attributes).filter((a) => may(a) && (!lot.hold || STEP_OF_ACTION[a] === "measuring")) };
  };
  const attributeSets = [{}, { use: "koji" }, { use: "starter" }, { use: "mash" }, { use: "mash", addition: "first" }];
  const parties = [{ id: "brewery", name: "Brewery" }, { id: "mill", name: "Kawabe Mill" }];

  it("for every role, kind, holder, hold and journey", () => {
    let compared = 0;
    for (const role of ROLES) {
      const actor: Actor = { id: `u-${role}`, role, partyId: "brewery" };
      const rights = floorRights(actor);
      for (const kind of LOT_KIND_LIST)
        for (const attributes of attributeSets)
          for (const party of parties)
            for (const hold of [undefined, { reason: "check" }])
              for (const inTransitTo of [undefined, parties[0]]) {
                const lot: FloorLot = { kind, attributes, party, hold, ...(inTransitTo ? { inTransitTo } : {}) };
                expect(offerFor(rights, lot)).toEqual(reference(actor, lot));
                compared += 1;
              }
    }
    expect(compared).toBe(ROLES.length * LOT_KIND_LIST.length * 40);
  });
});
