import "server-only";
import type { DbOrTx } from "@/db/client";
import { ADDITIONS, KOJI_CHECKPOINTS, RICE_USES, bandForUse, checkBand, kojiMeasurementName, steamedGainPct, waterAbsorptionPct, type Band, type RiceUse } from "@/domain/brewing";
import { ADDED_ALCOHOL_KG, ADDED_ALCOHOL_STRENGTH_PCT } from "@/domain/categories";
import { contentOfDraw } from "@/domain/composition";
import { isValidGtin } from "@/domain/gtin";
import { roundPct } from "@/domain/polishing";
import type { RecordableStep } from "@/domain/steps";
import type { EventInput } from "@/lib/validation/events";
import type { Translate } from "@/lib/validation/field-errors";
import { checkBottlingProduct } from "../ledger/bottling-product";
import { invalid, type FieldErrors } from "../platform/errors";
import type { LotRow } from "../ledger/event-rows";
import { readSetting } from "../platform/settings";
import { resolveFirstAdditionTank } from "./tank-register";

type Out = { kind: string; quantity: number; existing: LotRow | null; spec: Record<string, unknown> | null };
export type FloorCheck = { attributes: Record<string, unknown>; warnings: string[]; outputAttributes: Record<string, unknown> };

const EPS = 1e-6;
const sum = (xs: number[]) => xs.reduce((a, b) => a + b, 0);

/**
 * What each brew-floor step must carry, and the figures it yields on the dry basis
 * (definitions in src/domain/brewing.ts), compared with the brewery's bands.
 */
export function checkFloorStep(tx: DbOrTx, step: RecordableStep, input: EventInput, held: LotRow[], outs: Out[], t: Translate): FloorCheck | null {
  const errors: FieldErrors = {};
  const fail = (field: string, message: string) => (errors[field] ??= []).push(message);
  const m = (name: string) => input.measurements.find((x) => x.name === name && !x.lot)?.value;
  const need = (name: string) => (m(name) === undefined ? fail(`measurements.${name}`, t("validation.required")) : undefined);
  const drawn = input.inputs.map((i) => i.quantity);
  const dryKg = sum(held.map((lot, n) => contentOfDraw(drawn[n]!, lot)));
  const result: FloorCheck = { attributes: {}, warnings: [], outputAttributes: {} };
  const band = (label: string, value: number, b: Band) => {
    const check = checkBand(value, b);
    if (check !== "within") result.warnings.push(t("floor.outOfBand", { what: label, value: roundPct(value), min: b.min, max: b.max }));
    return check;
  };
  const bandCheckOf = (label: string, value: number, b: Band) => {
    const check = checkBand(value, b);
    if (check !== "within") result.warnings.push(t("floor.outOfBandC", { what: label, value, min: b.min, max: b.max }));
    return check;
  };
  const useOf = (o: Out | undefined) => (o?.spec?.use as string | undefined) ?? undefined;
  checkAddedAlcohol(input, held, outs, t);

  switch (step) {
    case "soaking": {
      const use = useOf(outs[0]);
      if (held.length !== 1 || outs.length !== 1) fail("outputs", t("floor.oneInOneOut"));
      // No use: soaked together, the portions are decided at the split.
      if (use !== undefined && !RICE_USES.includes(use as RiceUse)) fail("outputs.0.use", t("validation.oneOf", { options: RICE_USES.join(", ") }));
      need("soakMinutes");
      need("waterTempC");
      if (Object.keys(errors).length) throw invalid(errors);
      const drained = outs[0]!.quantity;
      if (drained < drawn[0]! - EPS) throw invalid({ "outputs.0.quantity": [t("floor.drainedBelowDry")] });
      const absorption = waterAbsorptionPct(drawn[0]!, drained);
      const b = bandForUse(readSetting(tx, "absorptionBands"), use);
      result.attributes = { use: use ?? null, dryKg: drawn[0], drainedKg: drained, absorptionPct: roundPct(absorption), band: b, bandCheck: band(t("floor.absorption"), absorption, b) };
      result.outputAttributes = use ? { use } : {};
      break;
    }
    case "steaming": {
      if (outs.length !== 1) fail("outputs", t("floor.oneInOneOut"));
      need("steamMinutes");
      if (Object.keys(errors).length) throw invalid(errors);
      const uses = [...new Set(held.map((l) => JSON.parse(l.attributes).use as string | undefined))];
      const use = (uses.length === 1 ? uses[0] : undefined) ?? useOf(outs[0]);
      const gain = steamedGainPct(dryKg, outs[0]!.quantity);
      const b = use && RICE_USES.includes(use as RiceUse) ? readSetting(tx, "steamGainBands")[use as RiceUse] : null;
      result.attributes = { use: use ?? null, dryKg, steamedKg: outs[0]!.quantity, gainPct: roundPct(gain), band: b, bandCheck: b ? band(t("floor.gain"), gain, b) : null };
      result.outputAttributes = use ? { use } : {};
      break;
    }
    case "splitting": {
      if (held.length !== 1) fail("inputs", t("floor.oneInOneOut"));
      outs.forEach((o, n) => {
        if (!RICE_USES.includes(useOf(o) as RiceUse)) fail(`outputs.${n}.use`, t("validation.oneOf", { options: RICE_USES.join(", ") }));
        if (useOf(o) === "mash" && !ADDITIONS.includes(o.spec?.addition as never)) fail(`outputs.${n}.addition`, t("validation.oneOf", { options: ADDITIONS.join(", ") }));
      });
      // A split moves rice, it makes none: the portions weigh what was taken from the lot.
      if (Math.abs(sum(outs.map((o) => o.quantity)) - sum(drawn)) > 0.001) fail("outputs", t("floor.portionsMustAddUp", { kg: sum(drawn) }));
      if (Object.keys(errors).length) throw invalid(errors);
      result.attributes = { portions: outs.map((o) => ({ use: useOf(o), kg: o.quantity, tank: o.spec?.tank ?? null, addition: o.spec?.addition ?? null })) };
      break;
    }
    case "koji-making": {
      need("sporeG");
      if (outs.length !== 1) fail("outputs", t("floor.oneInOneOut"));
      if (Object.keys(errors).length) throw invalid(errors);
      result.attributes = { steamedKg: sum(drawn), kojiKg: outs[0]!.quantity, riceKg: dryKg, startedAt: input.attributes?.startedAt ?? null };
      break;
    }
    case "starter":
    case "mash-addition": {
      need("waterL");
      if (step === "mash-addition") {
        const addition = input.attributes?.addition;
        if (!ADDITIONS.includes(addition as never)) fail("attributes.addition", t("validation.oneOf", { options: ADDITIONS.join(", ") }));
        const intoNew = outs.length === 1 && !outs[0]!.existing;
        if (addition === "first" && !intoNew) fail("outputs", t("floor.firstMakesTank"));
        if (addition !== "first" && addition !== undefined && intoNew) fail("outputs", t("floor.laterAddsToTank"));
      }
      if (outs.length !== 1) fail("outputs", t("floor.oneInOneOut"));
      if (Object.keys(errors).length) throw invalid(errors);
      const byKind = (kind: string) => sum(held.map((l, n) => (l.kind === kind ? drawn[n]! : 0)));
      result.attributes = { addition: input.attributes?.addition ?? null, kojiKg: byKind("koji"), steamedKg: byKind("steamed"), starterKg: byKind("starter"), waterL: m("waterL"), riceKg: dryKg };
      if (step === "mash-addition" && input.attributes?.addition === "first") {
        const tank = resolveFirstAdditionTank(tx, outs[0]!.spec ?? {}, t);
        if (tank) result.outputAttributes = tank;
        // Common practice: a mash is started from a yeast starter (moto); none is worth a second look.
        if (!held.some((l) => l.kind === "starter")) result.warnings.push(t("tankRegister.noStarter"));
      }
      break;
    }
    case "pressing": {
      if (!outs.some((o) => o.kind === "sake")) fail("outputs", t("floor.pressMakesSake"));
      if (Object.keys(errors).length) throw invalid(errors);
      result.attributes = { mashKg: sum(drawn), sakeL: sum(outs.filter((o) => o.kind === "sake").map((o) => o.quantity)), leesKg: sum(outs.filter((o) => o.kind === "lees").map((o) => o.quantity)) };
      break;
    }
    case "blending": {
      // Volumes of sake add up (the small contraction of alcohol and water is ignored).
      if (outs[0] && outs[0].quantity > sum(drawn) + 0.001) fail("outputs.0.quantity", t("validation.tooBig", { maximum: sum(drawn) }));
      if (Object.keys(errors).length) throw invalid(errors);
      result.attributes = { litresIn: sum(drawn), litresOut: outs[0]?.quantity ?? 0 };
      break;
    }
    case "bottling": {
      if (held.length !== 1 || outs.length !== 1) fail("outputs", t("floor.oneInOneOut"));
      const spec = outs[0]?.spec ?? {};
      if (typeof spec.gtin !== "string" || !isValidGtin(spec.gtin)) fail("outputs.0.gtin", t("floor.badGtin"));
      const ml = Number(spec.bottleMl);
      if (!(ml > 0 && ml <= 20_000)) fail("outputs.0.bottleMl", t("validation.tooBig", { maximum: 20_000 }));
      const count = outs[0]?.quantity ?? 0;
      if (!Number.isInteger(count)) fail("outputs.0.quantity", t("floor.wholeBottles"));
      const litres = (count * ml) / 1000;
      if (ml > 0 && Math.abs(litres - (drawn[0] ?? 0)) > 0.001) fail("inputs.0.quantity", t("floor.bottlesNeedLitres", { litres }));
      const named = held[0] ? checkBottlingProduct(tx, spec, held[0], t, errors) : null;
      if (Object.keys(errors).length) throw invalid(errors);
      result.attributes = { gtin: spec.gtin, bottleMl: ml, bottles: count, litres, ...named?.attributes };
      result.outputAttributes = { ...named?.attributes };
      result.warnings.push(...(named?.warnings ?? []));
      break;
    }
    case "measuring": {
      const bands = readSetting(tx, "kojiBands");
      const checks = KOJI_CHECKPOINTS.flatMap((c) => {
        const value = m(kojiMeasurementName(c));
        return value === undefined ? [] : [{ checkpoint: c, value, band: bands[c], bandCheck: bandCheckOf(t("floor.kojiTemp", { checkpoint: t(`floor.checkpoints.${c}`) }), value, bands[c]) }];
      });
      if (!checks.length) return null;
      result.attributes = { kojiChecks: checks };
      break;
    }
    default:
      return null;
  }
  return result;
}

/**
 * Brewing alcohol is recorded with its strength: the labelling standard weighs it converted to
 * 95 % alcohol (src/domain/categories.ts), and 30 kg at 30 % is a third of 30 kg at 95 %. One
 * addition and one strength per lot in an event, so that each weight pairs with its strength.
 */
function checkAddedAlcohol(input: EventInput, held: LotRow[], outs: Out[], t: Translate) {
  // A reading that names no lot lands on the first lot made, else the first lot drawn (writeMeasurements).
  const fallback = outs.some((o) => !o.existing) ? "" : (held[0]?.code ?? "");
  const lotOf = (m: EventInput["measurements"][number]) => m.lot ?? fallback;
  const errors: FieldErrors = {};
  for (const lot of new Set(input.measurements.map(lotOf))) {
    const readings = input.measurements.filter((m) => lotOf(m) === lot);
    const kg = readings.filter((m) => m.name === ADDED_ALCOHOL_KG);
    const strength = readings.filter((m) => m.name === ADDED_ALCOHOL_STRENGTH_PCT);
    if (!kg.length && !strength.length) continue;
    if (kg.length !== 1 || strength.length > 1) errors[`measurements.${ADDED_ALCOHOL_KG}`] = [t("floor.alcoholOncePerLot")];
    else if (!(kg[0]!.value > 0)) errors[`measurements.${ADDED_ALCOHOL_KG}`] = [t("floor.alcoholWeight")];
    if (!strength.length) errors[`measurements.${ADDED_ALCOHOL_STRENGTH_PCT}`] = [t("floor.alcoholStrengthNeeded")];
    else if (!(strength[0]!.value > 0 && strength[0]!.value <= 100)) errors[`measurements.${ADDED_ALCOHOL_STRENGTH_PCT}`] = [t("floor.alcoholStrength")];
  }
  if (Object.keys(errors).length) throw invalid(errors);
}
