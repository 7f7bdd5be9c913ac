import "server-only";
import { sql } from "drizzle-orm";
import type { EVENT_STEPS } from "@/db/schema";
import { timeAtOffset } from "@/domain/epcis-vocabulary";
import { can, type Actor } from "@/domain/permissions";
import { csvText } from "@/lib/validation/csv";
import type { Translate } from "@/lib/validation/field-errors";
import { getDb } from "../platform/db";
import { forbidden } from "../platform/errors";
import { describeEvents, type LotEvent } from "../ledger/lot-events";
import { descendantsOf, traceHead } from "./trace";
import type { SessionUser } from "../accounts/session";

type EventStep = (typeof EVENT_STEPS)[number];

/** Who may run a recall: the roles that read provenance or every record. */
export const canReadRecall = (actor: Actor | null) => can(actor, "provenance:read") || can(actor, "records:read-all");

export type RecallParty = { id: string; kind: string; name: string; address: string };
/** Any lot an event of the recall names, reached or not: what the export needs to identify it. */
export type LotRef = { code: string; kind: string; unit: string; variety: string | null; cropYear: number | null; grade: string | null; gtin: string | null };
export type RecallLot = LotRef & { fraction: number; onHand: number; holder: RecallParty };
export type Recall = {
  lot: { code: string; kind: string };
  /** The recalled lot first (fraction 1), then every lot it reached, in the order they were made. */
  lots: RecallLot[];
  /** Every event that made, added to, drew from, moved or measured one of those lots, and their corrections. */
  events: LotEvent[];
  refs: Map<string, LotRef>;
  parties: Map<string, RecallParty>;
};

/**
 * Everything a lot reached, with the events that touched it (ISO 22005 "one step forward",
 * repeated to the end). Read in one transaction, so the lots and events agree. Every set of
 * lots or events goes to SQLite as one JSON parameter: a wide recall names thousands.
 */
export function loadRecall(actor: SessionUser, code: string, steps: "all" | readonly EventStep[] = "all"): Recall {
  if (!canReadRecall(actor)) throw forbidden();
  return getDb().transaction((tx) => {
    const head = traceHead(actor, code);
    const fractions = new Map<string, number>([[head.code, 1], ...descendantsOf(head).map((r) => [r.code, r.fraction] as const)]);
    const recorded = describeEvents(eventsTouching(tx, [...fractions.keys()], steps));

    const codes = new Set([...fractions.keys(), ...recorded.flatMap((e) => [...e.inputs, ...e.outputs].map((x) => x.lot))]);
    // A GTIN counts only when it was recorded as text; SQLite picks it out, so the attributes are not parsed here.
    const rows = tx.all<LotRef & { onHand: number; holderId: string }>(sql`
      select code, kind, unit, variety, crop_year as cropYear, grade, case when json_type(attributes, '$.gtin') = 'text' then json_extract(attributes, '$.gtin') end as gtin,
        on_hand as onHand, party_id as holderId
      from lots where code in (select value from json_each(${JSON.stringify([...codes])}))`);
    const partyIds = new Set([...rows.map((r) => r.holderId), ...recorded.flatMap((e) => [e.party.id, e.counterparty?.id ?? e.party.id])]);
    const partyMap = new Map(
      tx.all<RecallParty>(sql`select id, kind, name, address from parties where id in (select value from json_each(${JSON.stringify([...partyIds])}))`).map((p) => [p.id, p]),
    );
    const refs = new Map<string, LotRef>(rows.map((r) => [r.code, { code: r.code, kind: r.kind, unit: r.unit, variety: r.variety, cropYear: r.cropYear, grade: r.grade, gtin: r.gtin }]));
    const byCode = new Map(rows.map((r) => [r.code, r]));
    // In the order of `fractions`: the recalled lot, then the reached lots as they were made.
    const recallLots = [...fractions].flatMap(([code, fraction]) => {
      const r = byCode.get(code);
      return r ? [{ ...refs.get(code)!, fraction, onHand: r.onHand, holder: partyMap.get(r.holderId)! }] : [];
    });
    return { lot: { code: head.code, kind: head.kind }, lots: recallLots, events: recorded, refs, parties: partyMap };
  });
}

/**
 * Every event that drew from, added to or moved one of these lots, and the corrections of those
 * events; or only the events of the given steps (the page lists shipments, holds need no event).
 */
function eventsTouching(tx: Pick<ReturnType<typeof getDb>, "all">, codes: string[], steps: "all" | readonly EventStep[]): number[] {
  if (steps !== "all" && !steps.length) return [];
  const touching = sql`
    with reached(id) as (select id from lots where code in (select value from json_each(${JSON.stringify(codes)}))),
    touching(id) as (
      select event_id from event_inputs where lot_id in reached
      union select event_id from event_outputs where lot_id in reached
    )`;
  const ids =
    steps === "all"
      ? tx.all<{ id: number }>(sql`${touching} select id from touching union select id from events where corrects in touching`)
      : tx.all<{ id: number }>(sql`${touching} select id from events where id in touching and step in (select value from json_each(${JSON.stringify(steps)}))`);
  return ids.map((r) => r.id);
}

export const RECALL_ENTRIES = ["created", "added", "drawn", "received", "shipped", "moved", "takenBack", "returned", "movedBack"] as const;
export type RecallEntry = (typeof RECALL_ENTRIES)[number];

/** One line of the recall spreadsheet: one event and one reached lot it touched. */
export type RecallRow = {
  at: string;
  lot: string;
  kind: string;
  variety: string | null;
  quantity: number;
  unit: string;
  entry: RecallEntry;
  step: string;
  location: string;
  counterparty: string;
  toBuyer: boolean;
  referenceDoc: string;
  fraction: number;
  party: string;
  recordedBy: string;
  eventId: number;
  corrects: number | null;
  correctedBy: number | null;
  reason: string;
};

// Weights to the gram, volumes to the millilitre: float sums of draws carry noise beyond that.
const round = (x: number, places: number) => Math.round(x * 10 ** places) / 10 ** places;

/**
 * The key data elements of each critical tracking event, after the US FDA Food Traceability
 * Rule (21 CFR Part 1 Subpart S, as a design template): what lot, what product, how much,
 * when, where, with whom, on which document — sorted by time, then lot. Measurements move
 * nothing and are left out.
 */
export function recallRows(recall: Recall): RecallRow[] {
  const byLot = new Map(recall.lots.map((l) => [l.code, l]));
  const createdBy = new Map<string, number>();
  for (const e of recall.events) {
    if (e.step === "correcting") continue;
    for (const o of e.outputs) if (!createdBy.has(o.lot) || createdBy.get(o.lot)! > e.id) createdBy.set(o.lot, e.id);
  }
  const rows: RecallRow[] = [];
  for (const e of recall.events) {
    if (e.step === "measuring") continue;
    const at = timeAtOffset(new Date(e.at));
    const party = recall.parties.get(e.party.id);
    const counterparty = e.counterparty ? recall.parties.get(e.counterparty.id) : undefined;
    const correction = e.step === "correcting";
    const line = (code: string, quantity: number, entry: RecallEntry) => {
      const lot = byLot.get(code)!;
      const row: RecallRow = {
        at,
        lot: code,
        kind: lot.kind,
        variety: lot.variety,
        quantity: round(quantity, 3),
        unit: lot.unit,
        entry,
        step: e.step,
        location: e.place || [party?.name, party?.address].filter(Boolean).join(", "),
        counterparty: counterparty?.name ?? "",
        toBuyer: e.step === "shipping" && counterparty?.kind === "buyer",
        referenceDoc: e.referenceDoc,
        fraction: round(lot.fraction, 6),
        party: e.party.name,
        recordedBy: e.user.name,
        eventId: e.id,
        corrects: e.corrects,
        correctedBy: e.correctedBy,
        reason: e.reason,
      };
      rows.push(row);
    };
    for (const i of e.inputs) {
      if (!byLot.has(i.lot) || i.use === "observe") continue;
      const entry: RecallEntry = correction ? (i.use === "move" ? "movedBack" : "takenBack") : e.step === "receiving" ? "received" : e.step === "shipping" ? "shipped" : i.use === "move" ? "moved" : "drawn";
      line(i.lot, i.quantity, entry);
    }
    for (const o of e.outputs) {
      if (!byLot.has(o.lot)) continue;
      line(o.lot, o.quantity, correction ? "returned" : createdBy.get(o.lot) === e.id ? "created" : "added");
    }
  }
  return sortRecallRows(rows);
}

/** By time, then lot, then event; lines that tie keep their order. The instants and the collator are taken once: a wide recall sorts thousands of lines. */
export function sortRecallRows(rows: RecallRow[]): RecallRow[] {
  const time = new Map(rows.map((r) => [r, Date.parse(r.at)]));
  return rows.sort((a, b) => time.get(a)! - time.get(b)! || byCode.compare(a.lot, b.lot) || a.eventId - b.eventId);
}

/** `localeCompare` in the default locale, as one collator. */
const byCode = new Intl.Collator();

const COLUMNS = ["date", "lot", "product", "quantity", "unit", "entry", "event", "location", "counterparty", "referenceDoc", "fraction", "party", "recordedBy", "eventId", "corrects", "correctedBy", "reason"] as const;

/** The spreadsheet itself; csvText guards cells against formula injection (OWASP, "CSV Injection"). */
export function recallCsv(rows: RecallRow[], t: Translate): string {
  // A few dozen distinct labels over thousands of lines: each is translated once.
  const label = once((key: string) => t(key));
  const product = once((kindAndVariety: string) => {
    const [kind, variety] = JSON.parse(kindAndVariety) as [string, string | null];
    return variety ? t("recall.product", { kind: label(`lot.kinds.${kind}`), variety }) : label(`lot.kinds.${kind}`);
  });
  return csvText(
    COLUMNS.map((c) => t(`recall.columns.${c}`)),
    rows.map((r) => [r.at, r.lot, product(JSON.stringify([r.kind, r.variety])), r.quantity, r.unit, label(`recall.entries.${r.entry}`), label(`steps.${r.step}`), r.location, r.counterparty, r.referenceDoc, r.fraction, r.party, r.recordedBy, r.eventId, r.corrects ?? "", r.correctedBy ?? "", r.reason]),
  );
}

/** A function of one string, remembered. */
function once(f: (key: string) => string): (key: string) => string {
  const seen = new Map<string, string>();
  return (key) => seen.get(key) ?? (seen.set(key, f(key)), seen.get(key)!);
}

/** Shipments that left for a buyer: the lines a recall notice goes out on. */
export function shipmentsToBuyers(rows: RecallRow[]): RecallRow[] {
  return rows.filter((r) => r.toBuyer && r.entry === "shipped");
}
