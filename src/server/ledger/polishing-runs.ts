import "server-only";
import type { DbOrTx } from "@/db/client";
import { apparentPolishingRatioPct, branYieldPct, missedTarget, roundPct, truePolishingRatioPct } from "@/domain/polishing";
import type { EventInput } from "@/lib/validation/events";
import type { Translate } from "@/lib/validation/field-errors";
import { contentOfDraw } from "@/domain/composition";
import { varietyShares, type VarietyShare } from "@/domain/varieties";
import { invalid } from "../platform/errors";
import type { LotRow } from "./event-rows";
import { readSetting } from "../platform/settings";

type Out = { kind: string; quantity: number; existing: unknown };

/** Measurement names a polishing run understands (values in %, g). */
export const POLISHING_MEASUREMENTS = {
  target: "targetPolishingRatioPct",
  thousandGrainBrown: "thousandGrainWeightBrownG",
  thousandGrainPolished: "thousandGrainWeightPolishedG",
} as const;

/**
 * A polishing run: harvest lots in by brown weight, one polished lot out (and at most one
 * bran lot), a target ratio. Returns the achieved figures and a warning when the run missed
 * its target by more than the brewery's margin.
 */
export function checkPolishingRun(tx: DbOrTx, input: EventInput, held: LotRow[], outs: Out[], t: Translate) {
  const polished = outs.filter((o) => o.kind === "polished" && !o.existing);
  const bran = outs.filter((o) => o.kind === "bran" && !o.existing);
  if (polished.length !== 1 || bran.length > 1 || polished.length + bran.length !== outs.length) {
    throw invalid({ outputs: [t("validation.needsOnePolished")] });
  }
  const m = (name: string) => input.measurements.find((x) => x.name === name)?.value;
  const target = m(POLISHING_MEASUREMENTS.target);
  if (target === undefined || !(target > 0 && target <= 100)) throw invalid({ measurements: [t("validation.needsTarget")] });

  const varieties = mixedVarieties(input, held, t);
  const brownKg = input.inputs.reduce((a, i) => a + i.quantity, 0);
  const polishedKg = polished[0]!.quantity;
  const branKg = bran[0]?.quantity ?? 0;
  if (polishedKg + branKg > brownKg + 1e-6) throw invalid({ outputs: [t("validation.tooBig", { maximum: brownKg })] });

  const achievedPct = apparentPolishingRatioPct(polishedKg, brownKg);
  const tgwBrown = m(POLISHING_MEASUREMENTS.thousandGrainBrown);
  const tgwPolished = m(POLISHING_MEASUREMENTS.thousandGrainPolished);
  const truePct = tgwBrown && tgwPolished ? truePolishingRatioPct(tgwPolished, tgwBrown) : null;
  const margin = readSetting(tx, "polishingMarginPts");
  const warnings: string[] = [];
  if (missedTarget(achievedPct, target, margin)) {
    warnings.push(t("polishing.missedTarget", { achieved: roundPct(achievedPct), margin, target }));
  }
  return {
    achievedPct,
    warnings,
    // The polished lot (and its bran) keeps every variety with its share of the rice.
    outputAttributes: varieties ? { varieties } : {},
    attributes: {
      brownKg,
      polishedKg,
      branKg,
      targetPolishingRatioPct: target,
      achievedPolishingRatioPct: roundPct(achievedPct),
      truePolishingRatioPct: truePct === null ? null : roundPct(truePct),
      branYieldPct: roundPct(branYieldPct(branKg, brownKg)),
      missedTarget: warnings.length > 0,
      marginPts: margin,
      ...(varieties ? { mixedVarietiesConfirmed: true, varieties: varieties.map((v) => `${v.variety} ${Math.round(v.share * 1000) / 10} %`).join(", ") } : {}),
    },
  };
}

/**
 * Two varieties polished together make a lot no single variety can be claimed for: the run
 * must say it means it (`attributes.mixedVarietiesConfirmed`), and the shares are kept.
 */
function mixedVarieties(input: EventInput, held: LotRow[], t: Translate): VarietyShare[] | null {
  const parts = held.map((lot, n) => ({ content: contentOfDraw(input.inputs[n]!.quantity, lot), variety: lot.variety, varieties: (JSON.parse(lot.attributes) as { varieties?: VarietyShare[] }).varieties }));
  const shares = varietyShares(parts);
  if (shares.length < 2) return null;
  if (input.attributes?.mixedVarietiesConfirmed !== true) {
    throw invalid({ "attributes.mixedVarietiesConfirmed": [t("varietyList.mixConfirm", { varieties: shares.map((v) => v.variety).join(", ") })] });
  }
  return shares;
}
