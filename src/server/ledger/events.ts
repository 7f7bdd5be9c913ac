import "server-only";
import { eq, inArray, sql } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { eventOutputs, lineageEdges, lotSourceDeltas, lots, parties } from "@/db/schema";
import { carryContent, contentOfDraw, edgesOf, propagateComposition, type SourceAmounts } from "@/domain/composition";
import { lowestGrade, type Grade } from "@/domain/grades";
import { can, canActOnLot, canDispatchLot, canSeeLot } from "@/domain/permissions";
import { STEP_RULES, UNIT_OF_KIND, type LotKind, type RecordableStep } from "@/domain/steps";
import type { EventInput, NewOutput } from "@/lib/validation/events";
import type { Translate } from "@/lib/validation/field-errors";
import { insertInChunks } from "./batch";
import { correctEvent } from "./corrections";
import { AppError, forbidden, invalid, type FieldErrors } from "../platform/errors";
import { createOnce, type StoredResponse } from "./idempotency";
import { allocateLotCode } from "./lot-codes";
import { checkFloorStep } from "../floor/floor-steps";
import { checkPolishingRun } from "./polishing-runs";
import { insertEvent, insertEventInput, lotByCode, requireAny, resolveEventParty, writeMeasurements, type LotRow } from "./event-rows";
import { applyReceipt, checkDispatch, inTransit } from "./receipts";
import { refuseIfHeld } from "../trace/holds";
import { recordSupplierEntries } from "../suppliers/supplier-entries";
import type { SessionUser } from "../accounts/session";

export { lotByCode, type LotRow } from "./event-rows";
export type OutputSummary = { code: string; kind: LotKind; quantity: number; unit: string };
export type EventResult = { id: number; outputs: OutputSummary[]; warnings: string[] };
/** A receipt no dispatch matched: stored, awaiting the sender; the same answer whatever the code named. */
export type AwaitingResult = { id: null; awaiting: "sender"; outputs: []; warnings: [] };

/** Tolerance for float sums of weights (a milligram). */
const EPS = 1e-6;

/**
 * Records one event in one IMMEDIATE transaction: the write lock is taken up front, so two
 * phones drawing from one lot are served one after the other, never both from the same kilo.
 * The same Idempotency-Key with the same body answers the first response again.
 */
export function recordEvent(actor: SessionUser, input: EventInput, t: Translate, idempotencyKey: string | null = null): StoredResponse {
  const response = createOnce("events", input, actor.id, idempotencyKey, (tx) => applyEvent(tx, actor, input, t));
  // 202: the receipt is on record, but nothing moves until the sender's word.
  return (response.body as { awaiting?: string }).awaiting ? { ...response, status: 202 } : response;
}

/** Records one event inside a transaction the caller holds (an import commits many at once). */
export function applyEvent(tx: DbOrTx, actor: SessionUser, input: EventInput, t: Translate): EventResult | AwaitingResult {
  if (input.step === "correcting") return correctEvent(tx, actor, input, t);
  return input.step === "receiving" ? applyReceipt(tx, actor, input, t) : applyStep(tx, actor, input, t);
}

type ResolvedOutput = { existing: LotRow | null; spec: NewOutput | null; kind: LotKind; quantity: number };

function applyStep(tx: DbOrTx, actor: SessionUser, input: EventInput, t: Translate): EventResult {
  const step = input.step as RecordableStep;
  const rule = STEP_RULES[step];
  requireAny(actor, rule.permission);
  const errors: FieldErrors = {};
  const fail = (field: string, message: string) => (errors[field] ??= []).push(message);

  if (input.corrects !== undefined) fail("corrects", t("validation.notForStep"));
  if (input.inputs.length < rule.minInputs) fail("inputs", t("validation.needsInputs", { count: rule.minInputs }));

  // A transformation draws something from every input; 0 kg is a typing slip, refused up front.
  if (rule.content !== "none") input.inputs.forEach((i, n) => i.quantity > 0 || fail(`inputs.${n}.quantity`, t("validation.moreThan", { minimum: 0 })));
  const eventParty = resolveEventParty(tx, actor, input, t);
  const inputKinds: readonly LotKind[] | "any" = rule.inputKinds;
  // A lot this user cannot see answers as unknown, as GET /api/lots/{code} does: no one learns
  // from a refusal that a code exists.
  const known = (lot: LotRow | undefined) => (lot && canSeeLot(actor, lot) ? lot : undefined);
  const inLots = input.inputs.map((i, n) => {
    const lot = known(lotByCode(tx, i.lot));
    if (!lot) fail(`inputs.${n}.lot`, t("validation.unknownLot"));
    else if (inputKinds !== "any" && !inputKinds.includes(lot.kind)) {
      fail(`inputs.${n}.lot`, t("validation.kindNotAllowed", { step: t(`steps.${step}`), kind: t(`lot.kinds.${lot.kind}`) }));
    }
    return lot;
  });

  const outs: ResolvedOutput[] = input.outputs.map((o, n) => {
    if ("lot" in o && typeof o.lot === "string") {
      const existing = known(lotByCode(tx, o.lot)) ?? null;
      if (!existing) fail(`outputs.${n}.lot`, t("validation.unknownLot"));
      else if (!("addsToExisting" in rule) || !(rule.outputKinds as readonly string[]).includes(existing.kind)) {
        fail(`outputs.${n}.lot`, t("validation.outputKindNotAllowed", { step: t(`steps.${step}`), kind: t(`lot.kinds.${existing.kind}`) }));
      }
      return { existing, spec: null, kind: (existing?.kind ?? "tank") as LotKind, quantity: o.quantity };
    }
    const spec = o as NewOutput;
    if (!(rule.outputKinds as readonly string[]).includes(spec.kind)) fail(`outputs.${n}.kind`, t("validation.outputKindNotAllowed", { step: t(`steps.${step}`), kind: t(`lot.kinds.${spec.kind}`) }));
    if (spec.unit && spec.unit !== UNIT_OF_KIND[spec.kind]) fail(`outputs.${n}.unit`, t("validation.unitNotAllowed", { kind: t(`lot.kinds.${spec.kind}`), unit: UNIT_OF_KIND[spec.kind] }));
    if (spec.kind === "bottled" && !(typeof spec.bottleMl === "number" && spec.bottleMl > 0)) fail(`outputs.${n}.bottleMl`, t("validation.required"));
    return { existing: null, spec, kind: spec.kind, quantity: spec.quantity };
  });
  if (rule.content !== "none" && outs.length === 0) fail("outputs", t("validation.required"));
  if (rule.content === "none" && outs.length > 0) fail("outputs", t("validation.notForStep"));
  const inIds = new Set(inLots.map((l) => l?.id));
  outs.forEach((o, n) => o.existing && inIds.has(o.existing.id) && fail(`outputs.${n}.lot`, t("validation.notForStep")));
  if (Object.keys(errors).length) throw invalid(errors);
  const held = inLots as LotRow[];

  const counterparty = resolveCounterparty(tx, step, input, t);
  // Shipping to a party that holds lots is a dispatch: the lot stays the sender's, in transit,
  // until the receiver's receipt. Bottles and sake shipped to a buyer are drawn, as ever.
  const dispatches = step === "shipping" && counterparty?.kind !== "buyer";
  const observes = step === "measuring";

  // Ownership: you record on lots your party holds (or, measuring, lots your party made); a
  // lot on its way to another party is drawn by no one until it arrives.
  for (const [n, lot] of held.entries()) {
    const allowed = dispatches ? canDispatchLot(actor, lot) : canActOnLot(actor, lot) || (observes && lot.originPartyId === actor.partyId);
    if (!allowed) throw forbidden("errors.notYourLot");
    if (step === "shipping" && !dispatches && !can(actor, "polishing:record") && !can(actor, "brewing:record")) throw forbidden();
    if (!observes && inTransit(lot)) throw new AppError("conflict", { key: "errors.inTransit", values: { code: lot.code } }, { [`inputs.${n}.lot`]: [t("errors.inTransit", { code: lot.code })] });
    // A lot on hold (after a recall) is neither drawn, shipped, dispatched nor bottled; a reading may still be taken.
    if (!observes) refuseIfHeld(tx, lot, `inputs.${n}.lot`, t);
  }
  for (const o of outs) if (o.existing && !canActOnLot(actor, o.existing)) throw forbidden("errors.notYourLot");
  // Nothing is added to a held lot either (a tank's next addition would mix more into what is held).
  outs.forEach((o, n) => o.existing && refuseIfHeld(tx, o.existing, `outputs.${n}.lot`, t));
  if (dispatches) checkDispatch(tx, { eventParty, counterparty: counterparty!, lots: held }, t);

  const warnings: string[] = [];
  const polishing = step === "polishing" ? checkPolishingRun(tx, input, held, outs, t) : null;
  if (polishing) warnings.push(...polishing.warnings);
  const floor = checkFloorStep(tx, step, input, held, outs, t);
  if (floor) warnings.push(...floor.warnings);

  // Draw (or move, or observe) each input.
  const at = input.at ? new Date(input.at) : new Date();
  const draws = held.map((lot, n) => {
    const quantity = input.inputs[n]!.quantity;
    if (observes) {
      if (quantity !== 0) throw invalid({ [`inputs.${n}.quantity`]: [t("validation.tooBig", { maximum: 0 })] });
      return { lot, quantity: 0, content: 0, use: "observe" as const };
    }
    if (dispatches) {
      // A lot travels whole: the slip weight is what the sender holds.
      if (Math.abs(quantity - lot.onHand) > EPS) throw invalid({ [`inputs.${n}.quantity`]: [t("validation.wholeLotOnly", { onHand: lot.onHand, unit: lot.unit })] });
      return { lot, quantity, content: 0, use: "dispatch" as const };
    }
    if (!(quantity > 0)) throw invalid({ [`inputs.${n}.quantity`]: [t("validation.moreThan", { minimum: 0 })] });
    return { lot, quantity, content: contentOfDraw(quantity, lot), use: "draw" as const };
  });
  drawFromOnHand(tx, draws, t);

  const eventId = insertEvent(tx, {
    step,
    at,
    recordedAt: new Date(),
    userId: actor.id,
    partyId: eventParty,
    counterpartyId: counterparty?.id ?? null,
    place: input.place ?? "",
    referenceDoc: input.referenceDoc ?? "",
    note: input.note ?? "",
    reason: "",
    attributes: JSON.stringify({ ...input.attributes, ...polishing?.attributes, ...floor?.attributes }),
  });

  for (const d of draws) {
    insertEventInput(tx, { eventId, lotId: d.lot.id, quantity: d.quantity, content: d.content, use: d.use, previousPartyId: null });
    if (d.use === "dispatch") tx.update(lots).set({ inTransitTo: counterparty!.id }).where(eq(lots.id, d.lot.id)).run();
  }

  const outputs = writeOutputs(tx, { eventId, at, step, eventParty, draws, outs, polishedRatio: polishing?.achievedPct ?? null, rule: rule.content, carried: { ...polishing?.outputAttributes, ...floor?.outputAttributes } });
  writeMeasurements(tx, eventId, input, held, outputs.lots, t);
  recordSupplierEntries(tx, { eventId, step, eventParty, counterparty, draws, at });
  return { id: eventId, outputs: outputs.summary, warnings };
}

export function resolveCounterparty(tx: DbOrTx, step: RecordableStep, input: EventInput, t: Translate) {
  const id = input.counterpartyId;
  if (!id) {
    if (step === "shipping") throw invalid({ counterpartyId: [t("validation.needsCounterparty")] });
    return null;
  }
  const party = tx.select({ id: parties.id, kind: parties.kind }).from(parties).where(eq(parties.id, id)).get();
  if (!party) throw invalid({ counterpartyId: [t("validation.unknownCounterparty")] });
  return party;
}

/** Takes each draw off on-hand only if that much is there; otherwise 409 and nothing changes. */
function drawFromOnHand(tx: DbOrTx, draws: { lot: LotRow; quantity: number; use: string }[], t: Translate) {
  const totals = new Map<number, { lot: LotRow; quantity: number; index: number }>();
  draws.forEach((d, index) => {
    if (d.use !== "draw") return;
    const entry = totals.get(d.lot.id) ?? { lot: d.lot, quantity: 0, index };
    entry.quantity += d.quantity;
    totals.set(d.lot.id, entry);
  });
  for (const { lot, quantity, index } of totals.values()) {
    const changed = tx
      .update(lots)
      .set({ onHand: sql`${lots.onHand} - ${quantity}` })
      .where(sql`${lots.id} = ${lot.id} and ${lots.onHand} + ${EPS} >= ${quantity}`)
      .run().changes;
    if (changed === 0) {
      const onHand = tx.select({ onHand: lots.onHand }).from(lots).where(eq(lots.id, lot.id)).get()!.onHand;
      throw new AppError("conflict", { key: "errors.overdraw", values: { code: lot.code, onHand: String(onHand), unit: lot.unit } }, {
        [`inputs.${index}.quantity`]: [t("validation.overdraw", { onHand, unit: lot.unit })],
      });
    }
  }
}

type WriteContext = {
  eventId: number;
  at: Date;
  step: RecordableStep;
  eventParty: string;
  draws: { lot: LotRow; content: number; use: string }[];
  outs: ResolvedOutput[];
  polishedRatio: number | null;
  rule: "carry" | "restart" | "none";
  /** Attributes every new output takes from its inputs (e.g. the use of soaked rice). */
  carried: Record<string, unknown>;
};

/** Creates or tops up the output lots, with their content and lineage edges. */
function writeOutputs(tx: DbOrTx, c: WriteContext) {
  const inputsDrawn = c.draws.filter((d) => d.use === "draw");
  const totalIn = inputsDrawn.reduce((a, d) => a + d.content, 0);
  const contents =
    c.rule === "carry"
      ? carryContent(totalIn, c.outs.map((o) => o.quantity))
      : c.outs.map((o) => (o.kind === "bottled" ? (o.quantity * Number(o.spec?.bottleMl ?? 0)) / 1000 : o.quantity));
  const inherited = inheritAttributes(inputsDrawn.map((d) => d.lot));
  const written: LotRow[] = [];
  const summary: OutputSummary[] = [];
  c.outs.forEach((o, n) => {
    const content = contents[n]!;
    let lot = o.existing;
    if (!lot) {
      const { kind, quantity: _q, unit: _u, ...attributes } = o.spec!;
      lot = tx
        .insert(lots)
        .values({
          code: allocateLotCode(tx, kind, c.at),
          kind,
          unit: UNIT_OF_KIND[kind],
          partyId: c.eventParty,
          originPartyId: c.eventParty,
          ...inherited,
          polishingRatioPct: kind === "polished" && c.polishedRatio != null ? c.polishedRatio : inherited.polishingRatioPct,
          attributes: JSON.stringify({ ...c.carried, ...attributes }),
          createdAt: c.at,
        })
        .returning()
        .get();
    }
    tx.update(lots)
      .set({ quantityIn: sql`${lots.quantityIn} + ${o.quantity}`, onHand: sql`${lots.onHand} + ${o.quantity}`, contentIn: sql`${lots.contentIn} + ${content}` })
      .where(eq(lots.id, lot.id))
      .run();
    tx.insert(eventOutputs).values({ eventId: c.eventId, lotId: lot.id, quantity: o.quantity, content }).run();
    written.push(lot);
    summary.push({ code: lot.code, kind: lot.kind, quantity: o.quantity, unit: lot.unit });
  });
  const edges = edgesOf(
    inputsDrawn.map((d) => ({ lotId: d.lot.id, content: d.content })),
    written.map((lot, n) => ({ lotId: lot.id, content: contents[n]! })),
  );
  insertInChunks(edges.map((e) => ({ ...e, eventId: c.eventId })), (rows) => tx.insert(lineageEdges).values(rows).run());
  const deltas = propagateComposition(
    inputsDrawn.map((d) => ({ content: d.content, contentIn: d.lot.contentIn, sources: sourceAmounts(tx, d.lot.id) })),
    written.map((lot, n) => ({ lotId: lot.id, content: contents[n]! })),
  );
  insertInChunks(deltas.map((d) => ({ ...d, eventId: c.eventId })), (rows) => tx.insert(lotSourceDeltas).values(rows).run());
  return { lots: written, summary };
}

/** How much of a lot's content each harvest lot accounts for (sums of its composition rows). */
export function sourceAmounts(tx: DbOrTx, lotId: number): SourceAmounts {
  const rows = tx
    .select({ source: lotSourceDeltas.sourceLotId, amount: sql<number>`sum(${lotSourceDeltas.amount})` })
    .from(lotSourceDeltas)
    .where(eq(lotSourceDeltas.lotId, lotId))
    .groupBy(lotSourceDeltas.sourceLotId)
    .all();
  return new Map(rows.map((r) => [r.source, r.amount]));
}

/**
 * What a new lot inherits from the lots it was made from: a variety or crop year only when
 * they all agree, the worst grade, and the highest (least polished) polishing ratio —
 * the figure a label claim must stand on.
 */
export function inheritAttributes(sources: LotRow[]) {
  const same = <T,>(values: T[]): T | null => (values.length && values.every((v) => v === values[0]) ? values[0]! : null);
  const ratios = sources.map((l) => l.polishingRatioPct).filter((v): v is number => v != null);
  const grades = sources.map((l) => l.grade).filter((g): g is Grade => g != null);
  return {
    variety: same(sources.map((l) => l.variety)),
    cropYear: same(sources.map((l) => l.cropYear)),
    grade: lowestGrade(grades),
    moisturePct: null,
    fieldId: same(sources.map((l) => l.fieldId)),
    polishingRatioPct: ratios.length ? Math.max(...ratios) : null,
  };
}

