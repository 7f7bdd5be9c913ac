import "server-only";
import type { DbOrTx } from "@/db/client";
import { apparentPolishingRatioPct, branYieldPct, missedTarget, roundPct, truePolishingRatioPct } from "@/domain/polishing";
import type { EventInput } from "@/lib/validation/events";
import type { Translate } from "@/lib/validation/field-errors";
import { invalid } from "./errors";
import { readSetting } from "./settings";

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
export function checkPolishingRun(tx: DbOrTx, input: EventInput, _held: unknown[], outs: Out[], t: Translate) {
  const polished = outs.filter((o) => o.kind === "polished" && !o.existing);
  const bran = outs.filter((o) => o.kind === "bran" && !o.existing);
  if (polished.length !== 1 || bran.length > 1 || polished.length + bran.length !== outs.length) {
    throw invalid({ outputs: [t("validation.needsOnePolished")] });
  }
  const m = (name: string) => input.measurements.find((x) => x.name === name)?.value;
  const target = m(POLISHING_MEASUREMENTS.target);
  if (target === undefined || !(target > 0 && target <= 100)) throw invalid({ measurements: [t("validation.needsTarget")] });

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
    },
  };
}
