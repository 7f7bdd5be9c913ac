/**
 * What a reader is shown of an event: every lot they may see as recorded, every other lot as
 * "another party's lot" — no code, no kind, no weight — and none of the event's figures that
 * would carry such a lot's weight (issue 12: a co-polished grower's rice, the brewery's sake on
 * a mill's page). Pure: the caller says which lots the reader may see.
 */

/** Whose a lot is, as canSeeLot (./permissions.ts) judges it. */
export type LotOwnership = { partyId: string; originPartyId: string; inTransitTo?: string | null };

type Input = { lot: string; quantity: number; unit: string; use: string; owner: LotOwnership };
type Output = { lot: string; kind: string; quantity: number; unit: string; owner: LotOwnership };
type Measurement = { name: string; value: number; unit: string; owner: LotOwnership | null };
export type RecordedDetails = { inputs: Input[]; outputs: Output[]; measurements: Measurement[]; attributes: Record<string, unknown> };

export type OtherPartyInput = { lot: null; quantity: null; unit: null; use: string; otherParty: true };
export type OtherPartyOutput = { lot: null; kind: null; quantity: null; unit: null; otherParty: true };
export type ShownDetails = {
  inputs: (Omit<Input, "owner"> | OtherPartyInput)[];
  outputs: (Omit<Output, "owner"> | OtherPartyOutput)[];
  measurements: Omit<Measurement, "owner">[];
  attributes: Record<string, unknown>;
};

/**
 * Event attributes that name no lot and weigh none: target and achieved ratios, bands and their
 * judgements, the rice's use, the mash addition, start times, the brewery's margin. Any other
 * (a run's kilograms, a split's portions, a pressing's litres, a bottling's count, and whatever
 * a later step adds) is shown only to a reader who may see every lot of the event.
 */
export const SHAREABLE_ATTRIBUTES: ReadonlySet<string> = new Set([
  "targetPolishingRatioPct",
  "achievedPolishingRatioPct",
  "truePolishingRatioPct",
  "branYieldPct",
  "missedTarget",
  "marginPts",
  "use",
  "absorptionPct",
  "gainPct",
  "band",
  "bandCheck",
  "addition",
  "startedAt",
  "kojiChecks",
]);

/** Units of an amount of rice, sake or bottles: an event-level figure in one is some lot's quantity. */
const AMOUNT_UNITS: ReadonlySet<string> = new Set(["kg", "t", "L", "l", "bottle"]);

const strip = <T extends { owner: unknown }>({ owner: _owner, ...rest }: T) => rest;

export function showEvent(details: RecordedDetails, maySee: (lot: LotOwnership) => boolean): ShownDetails {
  const hidden = [...details.inputs, ...details.outputs].some((l) => !maySee(l.owner));
  return {
    inputs: details.inputs.map((i) => (maySee(i.owner) ? strip(i) : { lot: null, quantity: null, unit: null, use: i.use, otherParty: true as const })),
    outputs: details.outputs.map((o) => (maySee(o.owner) ? strip(o) : { lot: null, kind: null, quantity: null, unit: null, otherParty: true as const })),
    measurements: details.measurements
      .filter((m) => (m.owner ? maySee(m.owner) : !(hidden && AMOUNT_UNITS.has(m.unit))))
      .map(strip),
    attributes: hidden ? Object.fromEntries(Object.entries(details.attributes).filter(([k]) => SHAREABLE_ATTRIBUTES.has(k))) : details.attributes,
  };
}
