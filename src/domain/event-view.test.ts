import { describe, expect, it } from "vitest";
import { SHAREABLE_ATTRIBUTES, showEvent, type LotOwnership, type RecordedDetails } from "./event-view";

const ikeda: LotOwnership = { partyId: "mill", originPartyId: "ikeda" };
const coop: LotOwnership = { partyId: "mill", originPartyId: "coop" };
const mill: LotOwnership = { partyId: "mill", originPartyId: "mill" };
const asIkeda = (lot: LotOwnership) => lot.partyId === "ikeda" || lot.originPartyId === "ikeda";

/** A co-polished run as the polishing step records it (src/server/ledger/polishing-runs.ts). */
const run: RecordedDetails = {
  inputs: [
    { lot: "H26-0001", quantity: 1800, unit: "kg", use: "draw", owner: ikeda },
    { lot: "H26-0005", quantity: 1200, unit: "kg", use: "draw", owner: coop },
  ],
  outputs: [{ lot: "P26-0001", kind: "polished", quantity: 1500, unit: "kg", owner: mill }],
  measurements: [
    { name: "targetPolishingRatioPct", value: 50, unit: "%", owner: null },
    { name: "thousandGrainWeightBrownG", value: 27.2, unit: "g", owner: null },
    { name: "moisturePct", value: 14.1, unit: "%", owner: coop },
    { name: "branKg", value: 1440, unit: "kg", owner: null },
  ],
  attributes: { brownKg: 3000, polishedKg: 1500, branKg: 1440, targetPolishingRatioPct: 50, achievedPolishingRatioPct: 50, missedTarget: false, portions: [{ kg: 1 }] },
};

describe("an event shown to a party that sees only some of its lots", () => {
  const shown = showEvent(run, asIkeda);

  it("names its own lot and weight, and the others only as another party's lot", () => {
    expect(shown.inputs).toEqual([
      { lot: "H26-0001", quantity: 1800, unit: "kg", use: "draw" },
      { lot: null, quantity: null, unit: null, use: "draw", otherParty: true },
    ]);
    expect(shown.outputs).toEqual([{ lot: null, kind: null, quantity: null, unit: null, otherParty: true }]);
  });

  it("drops the figures that weigh another party's lot, keeps ratios and readings of no lot", () => {
    expect(shown.attributes).toEqual({ targetPolishingRatioPct: 50, achievedPolishingRatioPct: 50, missedTarget: false });
    expect(shown.measurements.map((m) => m.name)).toEqual(["targetPolishingRatioPct", "thousandGrainWeightBrownG"]);
    expect(JSON.stringify(shown)).not.toMatch(/H26-0005|P26-0001|1200|1500|3000|1440/);
  });
});

describe("an event shown to a party that sees every lot", () => {
  it("is the event as recorded, without the ownership it was judged by", () => {
    const shown = showEvent(run, () => true);
    expect(shown.attributes).toEqual(run.attributes);
    expect(shown.inputs.map((i) => i.lot)).toEqual(["H26-0001", "H26-0005"]);
    expect(shown.measurements).toHaveLength(4);
    expect(JSON.stringify(shown)).not.toContain("owner");
  });
});

describe("the attributes safe to share", () => {
  it("name no weight or count (no key ends in Kg, L or a count)", () => {
    for (const key of SHAREABLE_ATTRIBUTES) expect(key).not.toMatch(/Kg$|L$|litres|bottles|portions|bags/);
  });
});
