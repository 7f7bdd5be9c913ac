import "server-only";
import {
  ACTION_OF_STEP,
  DISPOSITION_OF_STEP,
  EPCIS_CONTEXT,
  EPCIS_SCHEMA_VERSION,
  ERROR_REASON_OF_REVERSAL,
  GRAINLINE_VOCAB,
  TIME_ZONE_OFFSET,
  VOCAB_PREFIX,
  bizStepOf,
  eventUri,
  isTransformationStep,
  lotClassUri,
  partyLocationUri,
  partyUri,
  sensorOf,
  timeAtOffset,
  uomOf,
} from "@/domain/epcis-vocabulary";
import type { LotEvent } from "../ledger/lot-events";
import type { Recall } from "./recall";

type EpcisEvent = Record<string, unknown>;
const gl = (term: string) => `${VOCAB_PREFIX}:${term}`;
// Same rounding as the recall spreadsheet: grams and millilitres.
const round = (x: number) => Math.round(x * 1000) / 1000;

/**
 * The recall's events as a GS1 EPCIS 2.0 document (JSON-LD): transformations as
 * TransformationEvents, registrations, receipts, shipments and measurements as
 * ObjectEvents. A correction becomes the EPCIS error declaration of the event it reverses:
 * a copy of that event, with its type and eventID, plus `errorDeclaration`.
 */
export function recallEpcisDocument(recall: Recall, now = new Date()) {
  const byId = new Map(recall.events.map((e) => [e.id, e]));
  const eventList: EpcisEvent[] = [];
  for (const e of recall.events) {
    if (e.step !== "correcting") {
      const event = toEpcisEvent(e, recall);
      if (event) eventList.push(event);
      continue;
    }
    const original = e.corrects === null ? undefined : byId.get(e.corrects);
    const copy = original && toEpcisEvent(original, recall);
    if (!copy) continue;
    eventList.push({
      ...copy,
      recordTime: timeAtOffset(new Date(e.recordedAt)),
      errorDeclaration: { declarationTime: timeAtOffset(new Date(e.at)), reason: ERROR_REASON_OF_REVERSAL, ...(e.reason ? { [gl("reason")]: e.reason } : {}) },
    });
  }
  return {
    "@context": [EPCIS_CONTEXT, { [VOCAB_PREFIX]: GRAINLINE_VOCAB }],
    type: "EPCISDocument",
    schemaVersion: EPCIS_SCHEMA_VERSION,
    creationDate: timeAtOffset(now),
    epcisBody: { eventList },
  };
}

function toEpcisEvent(e: LotEvent, recall: Recall): EpcisEvent | null {
  const quantity = (lot: string, amount?: number) => {
    const ref = recall.refs.get(lot)!;
    return { epcClass: lotClassUri(lot, ref.gtin), ...(amount === undefined ? {} : { quantity: round(amount), uom: uomOf(ref.unit) }) };
  };
  const sensors = sensorElements(e);
  const common = {
    eventTime: timeAtOffset(new Date(e.at)),
    eventTimeZoneOffset: TIME_ZONE_OFFSET,
    recordTime: timeAtOffset(new Date(e.recordedAt)),
    eventID: eventUri(e.id),
  };
  const where = {
    bizStep: bizStepOf(e.step),
    ...(DISPOSITION_OF_STEP[e.step] ? { disposition: DISPOSITION_OF_STEP[e.step] } : {}),
    bizLocation: { id: partyLocationUri(e.party.id) },
  };
  const extensions = { ...(e.place ? { [gl("place")]: e.place } : {}), ...(e.referenceDoc ? { [gl("referenceDocument")]: e.referenceDoc } : {}) };
  const withSensors = sensors.length ? { sensorElementList: sensors } : {};

  if (isTransformationStep(e.step)) {
    const drawn = e.inputs.filter((i) => i.use === "draw");
    return {
      type: "TransformationEvent",
      ...common,
      ...(drawn.length ? { inputQuantityList: drawn.map((i) => quantity(i.lot, i.quantity)) } : {}),
      ...(e.outputs.length ? { outputQuantityList: e.outputs.map((o) => quantity(o.lot, o.quantity)) } : {}),
      ...where,
      ...withSensors,
      ...extensions,
    };
  }
  const object = { type: "ObjectEvent", ...common, action: ACTION_OF_STEP[e.step] };
  switch (e.step) {
    case "registering": {
      const made = e.outputs[0];
      const ref = made && recall.refs.get(made.lot);
      if (!made || !ref) return null;
      const ilmd = { [gl("variety")]: ref.variety, [gl("cropYear")]: ref.cropYear, [gl("grade")]: ref.grade };
      return { ...object, quantityList: [quantity(made.lot, made.quantity)], ...where, ilmd: Object.fromEntries(Object.entries(ilmd).filter(([, v]) => v != null)), ...extensions };
    }
    case "receiving":
    case "shipping": {
      // A receipt's shortfall (loss in transit) is not an object that changed hands.
      const moved = e.inputs.filter((i) => i.use !== "observe" && i.use !== "loss");
      if (!moved.length) return null;
      const [from, to] = e.step === "receiving" ? [e.counterparty?.id, e.party.id] : [e.party.id, e.counterparty?.id];
      // CBV possessing_party: Grainline follows who holds a lot, not who owns it.
      const parties = from && to ? { sourceList: [{ type: "possessing_party", source: partyUri(from) }], destinationList: [{ type: "possessing_party", destination: partyUri(to) }] } : {};
      return { ...object, quantityList: moved.map((i) => quantity(i.lot, i.quantity)), ...where, ...parties, ...extensions };
    }
    case "measuring": {
      // Only measurements that fit a GS1 measurement type are exported; the rest stay in Grainline.
      if (!sensors.length) return null;
      return { ...object, quantityList: e.inputs.map((i) => quantity(i.lot)), ...where, ...withSensors, ...extensions };
    }
    default:
      return null;
  }
}

function sensorElements(e: LotEvent) {
  const reports = e.measurements.flatMap((m) => {
    const sensor = sensorOf(m);
    return sensor ? [{ type: sensor.type, value: m.value, uom: sensor.uom, [gl("measurement")]: m.name }] : [];
  });
  return reports.length ? [{ sensorMetadata: { time: timeAtOffset(new Date(e.at)) }, sensorReport: reports }] : [];
}
