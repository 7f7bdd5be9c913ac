import type { Permission } from "./permissions";
import type { PartyKind } from "./roles";

export const LOT_KIND_LIST = ["harvest", "polished", "bran", "soaked", "steamed", "koji", "starter", "tank", "sake", "lees", "blend", "bottled"] as const;
export type LotKind = (typeof LOT_KIND_LIST)[number];
export type LotUnit = "kg" | "L" | "bottle";

export const UNIT_OF_KIND: Record<LotKind, LotUnit> = {
  harvest: "kg",
  polished: "kg",
  bran: "kg",
  soaked: "kg",
  steamed: "kg",
  koji: "kg",
  starter: "kg",
  tank: "kg",
  sake: "L",
  lees: "kg",
  blend: "L",
  bottled: "bottle",
};

/** Lot-code prefixes of Grainline's own scheme (see lot-code.ts). */
export const CODE_PREFIX: Record<LotKind, string> = {
  harvest: "H",
  polished: "P",
  bran: "BR",
  soaked: "SK",
  steamed: "ST",
  koji: "K",
  starter: "Y",
  tank: "T",
  sake: "S",
  lees: "L",
  blend: "BL",
  bottled: "BT",
};

/**
 * How an event's outputs get their content (what shares are traced over):
 * - "carry": the inputs' content passes on unchanged, split by output weight (rice steps);
 * - "restart": each output's own quantity becomes its content (polished rice from brown,
 *   sake litres from a mash, blends and bottlings by volume);
 * - "none": nothing new is made (receipts, shipments, measurements).
 */
export type ContentRule = "carry" | "restart" | "none";

export type StepRule = {
  permission: Permission | Permission[];
  inputKinds: readonly LotKind[] | "any";
  outputKinds: readonly LotKind[];
  minInputs: number;
  content: ContentRule;
  /** Outputs may name an existing lot to add to (a tank across its additions). */
  addsToExisting?: boolean;
};

const RICE_AFTER_MILL: LotKind[] = ["polished", "soaked", "steamed", "koji", "starter"];

export const STEP_RULES = {
  receiving: { permission: ["polishing:record", "brewing:record"], inputKinds: "any", outputKinds: [], minInputs: 1, content: "none" },
  // A grower dispatches its own harvest (the sender's word a receipt needs); see canDispatchLot.
  shipping: { permission: ["polishing:record", "brewing:record", "harvests:dispatch-own"], inputKinds: "any", outputKinds: [], minInputs: 1, content: "none" },
  polishing: { permission: "polishing:record", inputKinds: ["harvest"], outputKinds: ["polished", "bran"], minInputs: 1, content: "restart" },
  soaking: { permission: "brewing:record", inputKinds: ["polished"], outputKinds: ["soaked"], minInputs: 1, content: "carry" },
  steaming: { permission: "brewing:record", inputKinds: ["soaked", "polished"], outputKinds: ["steamed"], minInputs: 1, content: "carry" },
  splitting: { permission: "brewing:record", inputKinds: ["steamed"], outputKinds: ["steamed"], minInputs: 1, content: "carry" },
  "koji-making": { permission: "brewing:record", inputKinds: ["steamed"], outputKinds: ["koji"], minInputs: 1, content: "carry" },
  starter: { permission: "brewing:record", inputKinds: ["koji", "steamed"], outputKinds: ["starter"], minInputs: 1, content: "carry" },
  "mash-addition": { permission: "brewing:record", inputKinds: ["koji", "steamed", "starter"], outputKinds: ["tank"], minInputs: 1, content: "carry", addsToExisting: true },
  pressing: { permission: "brewing:record", inputKinds: ["tank"], outputKinds: ["sake", "lees"], minInputs: 1, content: "restart" },
  blending: { permission: "brewing:record", inputKinds: ["sake", "blend"], outputKinds: ["blend"], minInputs: 2, content: "restart" },
  bottling: { permission: "brewing:record", inputKinds: ["sake", "blend"], outputKinds: ["bottled"], minInputs: 1, content: "restart" },
  measuring: { permission: ["polishing:record", "brewing:record", "harvests:record-own", "harvests:record-any"], inputKinds: "any", outputKinds: [], minInputs: 1, content: "none" },
} as const satisfies Record<string, StepRule>;

export type RecordableStep = keyof typeof STEP_RULES;

/**
 * What a party of each kind takes in by a receipt: the lots that travel to it from another party
 * (common practice). A mill takes in brown rice to polish; a brewery brown or polished rice, and
 * sake bought in bulk from another brewery. Lots in process (soaked and steamed rice, koji,
 * starter, a tank's mash) never leave the brewery that made them, and growers and buyers record
 * no receipts. A dispatch goes only to a party that takes in the lot's kind.
 */
export const RECEIVABLE_KINDS: Record<PartyKind, readonly LotKind[]> = {
  mill: ["harvest"],
  brewery: ["harvest", "polished", "sake"],
  grower: [],
  buyer: [],
};

/** The steps `POST /api/events` takes (../shared/api.md): every rule above, and corrections. */
export const API_STEPS = [
  "receiving", "shipping", "polishing", "soaking", "steaming", "splitting", "koji-making", "starter",
  "mash-addition", "pressing", "blending", "bottling", "measuring", "correcting",
] as const satisfies readonly (RecordableStep | "correcting")[];

export const isRiceKind = (kind: LotKind) => kind === "harvest" || RICE_AFTER_MILL.includes(kind);

/** Bottle sizes of the trade: the 1.8 L isshobin, the 720 mL yongobin, the 300 mL bottle. */
export const BOTTLE_SIZES_ML = [1800, 720, 300] as const;
/** Rice is priced and bagged by the 60 kg bag (common practice in the Japanese rice trade). */
export const BAG_KG = 60;
