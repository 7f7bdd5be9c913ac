import "server-only";
import type { DbOrTx } from "@/db/client";
import { translator } from "@/i18n/messages";
import type { Translate } from "@/lib/validation/field-errors";
import type { EventInput } from "@/lib/validation/events";
import { applyEvent, type EventResult } from "../ledger/events";
import { registerHarvestInTx } from "../ledger/harvests";
import type { SessionUser } from "../accounts/session";

type Users = Record<"admin" | "grower" | "grower2" | "miller" | "brewer", SessionUser>;

const at = (date: string) => `${date}T10:00:00+09:00`;

/**
 * The invented 2026 season: six harvest lots of two varieties from the three growers,
 * receipts at the mill, polishing runs to 50, 60 and 70 %, one run corrected and recorded
 * again, and the polished rice received at the brewery. One lot stays in the mill's queue.
 */
export function seedSeason(tx: DbOrTx, u: Users) {
  const en = translator("en");
  const t: Translate = (key, values) => en(key as never, values as never);
  const harvest = (actor: SessionUser, fieldId: string, variety: string, brownKg: number, moisturePct: number, grade: string, bags: number, date: string) =>
    registerHarvestInTx(tx, actor, { fieldId, variety, cropYear: 2026, brownKg, moisturePct, grade: grade as never, bags, at: at(date) }, t).code;
  const record = (actor: SessionUser, input: Partial<EventInput> & { step: EventInput["step"] }): EventResult =>
    applyEvent(tx, actor, { inputs: [], outputs: [], measurements: [], ...input } as EventInput, t) as EventResult;
  // Each receipt answers the sender's dispatch of the day before (the slip travels with the rice).
  const dispatch = (actor: SessionUser, lot: string, kg: number, to: string, slip: string, date: string, partyId?: string) =>
    record(actor, { step: "shipping", at: `${date}T07:30:00+09:00`, inputs: [{ lot, quantity: kg }], counterpartyId: to, partyId, referenceDoc: slip });

  const h1 = harvest(u.grower, "field-ikeda-terrace", "Yamada Nishiki", 1800, 14.6, "1", 30, "2026-09-24");
  const h2 = harvest(u.grower, "field-ikeda-cedar", "Yamada Nishiki", 1200, 14.9, "2", 20, "2026-09-26");
  const h3 = harvest(u.grower2, "field-nakase-river", "Omachi", 2400, 15.0, "1", 40, "2026-10-03");
  const h4 = harvest(u.grower2, "field-nakase-shrine", "Omachi", 900, 14.4, "3", 15, "2026-10-04");
  const h5 = harvest(u.admin, "field-coop-north", "Yamada Nishiki", 3000, 14.7, "tokuto", 50, "2026-09-29");
  const h6 = harvest(u.admin, "field-coop-stone", "Omachi", 1500, 14.8, "2", 25, "2026-10-08");

  const slips: [string, number, string][] = [[h1, 1800, "DS-2026-101"], [h2, 1200, "DS-2026-102"], [h3, 2400, "DS-2026-103"], [h4, 900, "DS-2026-104"], [h5, 3000, "DS-2026-105"], [h6, 1500, "DS-2026-106"]];
  const senders = [u.grower, u.grower, u.grower2, u.grower2, u.admin, u.admin];
  slips.forEach(([lot, kg, slip], n) => {
    const date = `2026-10-${String(10 + n).padStart(2, "0")}`;
    dispatch(senders[n]!, lot, kg, "mill-shirotae", slip, date, n >= 4 ? "grower-coop" : undefined);
    record(u.miller, { step: "receiving", at: at(date), inputs: [{ lot, quantity: kg }], referenceDoc: slip, place: "Shirotae mill yard" });
  });

  const polish = (date: string, inputs: [string, number][], polishedKg: number, branKg: number, target: number, tgw?: [number, number]) =>
    record(u.miller, {
      step: "polishing",
      at: at(date),
      inputs: inputs.map(([lot, quantity]) => ({ lot, quantity })),
      outputs: [{ kind: "polished", quantity: polishedKg }, { kind: "bran", quantity: branKg }],
      measurements: [
        { name: "targetPolishingRatioPct", value: target, unit: "%" },
        ...(tgw ? [{ name: "thousandGrainWeightBrownG", value: tgw[0], unit: "g" }, { name: "thousandGrainWeightPolishedG", value: tgw[1], unit: "g" }] : []),
      ],
    });

  const r1 = polish("2026-10-20", [[h1, 1800], [h5, 1200]], 1500, 1440, 50, [27.2, 13.9]);
  const r2 = polish("2026-10-24", [[h3, 2400]], 1680, 690, 70, [26.1, 18.5]);
  const r3 = polish("2026-10-28", [[h2, 1200], [h5, 1800]], 1800, 1150, 60);
  const wrong = polish("2026-11-02", [[h4, 900]], 590, 290, 60);
  record(u.admin, { step: "correcting", at: at("2026-11-03"), corrects: wrong.id, reason: "Polished weight keyed from the wrong scale ticket" });
  const r4 = polish("2026-11-03", [[h4, 900]], 540, 340, 60);

  for (const [run, n] of [[r1, 1], [r2, 2], [r3, 3], [r4, 4]] as const) {
    const polished = run.outputs.find((o) => o.kind === "polished")!;
    const date = `2026-11-${String(5 + n).padStart(2, "0")}`;
    dispatch(u.miller, polished.code, polished.quantity, "brewery-kirinoha", `SH-2026-0${n}`, date);
    record(u.brewer, { step: "receiving", at: at(date), inputs: [{ lot: polished.code, quantity: polished.quantity }], referenceDoc: `SH-2026-0${n}`, place: "Kirinoha rice store" });
  }
}
