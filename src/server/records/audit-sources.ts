import "server-only";
import { desc, eq, inArray } from "drizzle-orm";
import { eventInputs, eventOutputs, events, lots, receiptOutcomes, receiptRequests, supplierContracts, supplierEntries, supplierStatements } from "@/db/schema";
import { getDb } from "../platform/db";
import type { AuditNames } from "./audit-names";

/**
 * One line of the audit record. Each source stays in its own append-only table; the record
 * reads them side by side instead of copying them into audit_log. `summary` is a catalogue
 * key (audit.summaries.*) with the values it names: names and codes, never ids or JSON.
 */
export type AuditValue =
  | string
  | number
  | { yen: number }
  /** A catalogue word (a role, a step). */
  | { label: string }
  /** A changed field, named by audit.fields.<field> where the catalogue has it. */
  | { field: string; change: string; word?: string }
  /** Lots with their amounts, worded by the reader's catalogue ("P26-0002 (800 bottles)"). */
  | { lots: LotAmount[] }
  | AuditValue[];
export type AuditItem = { id: string; at: Date; userName: string; summary: { key: string; values: Record<string, AuditValue> } };

export type LotAmount = { code: string; quantity: number | null; unit: string };

const db = () => getDb();
const listed = (lots: LotAmount[]): AuditValue => (lots.length ? { lots } : "—");

/** Every event, with the lots it drew from and made (codes and quantities). */
export function eventItems(names: AuditNames, limit: number): AuditItem[] {
  const rows = db().select().from(events).orderBy(desc(events.id)).limit(limit).all();
  const ids = rows.map((r) => r.id);
  const corrected = rows.filter((r) => r.corrects != null).map((r) => r.corrects!);
  const stepOf = new Map(db().select({ id: events.id, step: events.step, at: events.at }).from(events).where(inArray(events.id, corrected.length ? corrected : [-1])).all().map((r) => [r.id, r]));
  const lotsOf = lotLines([...ids, ...corrected]);
  return rows.map((e) => {
    const lines = lotsOf.get(e.id) ?? { inputs: [], outputs: [] };
    const values: Record<string, AuditValue> = {
      party: names.party(e.partyId),
      step: { label: `steps.${e.step}` },
      inputs: listed(lines.inputs),
      outputs: listed(lines.outputs),
      counterparty: e.counterpartyId ? names.party(e.counterpartyId) : "—",
    };
    if (e.step === "correcting") {
      const old = e.corrects != null ? stepOf.get(e.corrects) : undefined;
      values.corrected = old ? { label: `steps.${old.step}` } : "—";
      values.reason = e.reason || "—";
      const was = e.corrects != null ? lotsOf.get(e.corrects) : undefined;
      values.lots = was ? listed([...was.inputs, ...was.outputs]) : "—";
    }
    const key = `summaries.${e.step === "correcting" ? "correcting" : e.step === "shipping" || e.step === "receiving" ? "handOver" : "event"}`;
    return { id: `event-${e.id}`, at: e.recordedAt, userName: names.user(e.userId), summary: { key, values } };
  });
}

function lotLines(eventIds: number[]) {
  const out = new Map<number, { inputs: LotAmount[]; outputs: LotAmount[] }>();
  if (!eventIds.length) return out;
  const of = (id: number) => out.get(id) ?? (out.set(id, { inputs: [], outputs: [] }), out.get(id)!);
  const ins = db().select({ eventId: eventInputs.eventId, code: lots.code, unit: lots.unit, q: eventInputs.quantity, use: eventInputs.use }).from(eventInputs).innerJoin(lots, eq(lots.id, eventInputs.lotId)).where(inArray(eventInputs.eventId, eventIds)).all();
  for (const r of ins) if (r.use !== "loss") of(r.eventId).inputs.push({ code: r.code, quantity: r.q ? Math.abs(r.q) : null, unit: r.unit });
  const outs = db().select({ eventId: eventOutputs.eventId, code: lots.code, unit: lots.unit, q: eventOutputs.quantity }).from(eventOutputs).innerJoin(lots, eq(lots.id, eventOutputs.lotId)).where(inArray(eventOutputs.eventId, eventIds)).all();
  for (const r of outs) of(r.eventId).outputs.push({ code: r.code, quantity: Math.abs(r.q), unit: r.unit });
  return out;
}

/** Money on a supplier's account: deliveries, fees, payments, adjustments and reversals. */
export function entryItems(names: AuditNames, limit: number): AuditItem[] {
  return db().select().from(supplierEntries).orderBy(desc(supplierEntries.id)).limit(limit).all().map((e) => ({
    id: `entry-${e.id}`,
    at: e.recordedAt,
    userName: names.user(e.userId),
    summary: {
      key: `summaries.entry.${e.kind}`,
      values: { party: names.party(e.partyId), amount: { yen: e.kind === "payment" ? -e.amountYen : e.amountYen }, lot: e.lotId ? names.lot(e.lotId) : "—", reference: e.reference || "—", reason: e.reason || "—" },
    },
  }));
}

export function statementItems(names: AuditNames, limit: number): AuditItem[] {
  return db().select().from(supplierStatements).orderBy(desc(supplierStatements.id)).limit(limit).all().map((s) => ({
    id: `statement-${s.id}`,
    at: s.issuedAt,
    userName: names.user(s.userId),
    summary: { key: "summaries.statement", values: { number: s.number, party: names.party(s.partyId), from: s.fromDay, to: s.toDay, balance: { yen: s.balanceYen } } },
  }));
}

export function contractItems(names: AuditNames, limit: number): AuditItem[] {
  return db().select().from(supplierContracts).orderBy(desc(supplierContracts.id)).limit(limit).all().map((c) => ({
    id: `contract-${c.id}`,
    at: c.createdAt,
    userName: names.user(c.userId),
    summary: {
      key: `summaries.contract.${c.kind}`,
      values: { party: names.party(c.partyId), version: c.version, variety: c.variety ?? "—", cropYear: c.cropYear ?? "—" },
    },
  }));
}

/** Receipts that answered no dispatch, and the sender's (or office's) answer to each. */
export function receiptItems(names: AuditNames, limit: number): AuditItem[] {
  const requests = db().select().from(receiptRequests).orderBy(desc(receiptRequests.id)).limit(limit).all();
  const outcomes = db().select({ o: receiptOutcomes, r: receiptRequests }).from(receiptOutcomes).innerJoin(receiptRequests, eq(receiptRequests.id, receiptOutcomes.requestId)).orderBy(desc(receiptOutcomes.id)).limit(limit).all();
  const request = (r: typeof receiptRequests.$inferSelect) => ({ code: r.code, quantity: Math.round(r.quantity * 100) / 100, receiver: names.party(r.receiverPartyId), reference: r.referenceDoc || "—" });
  return [
    ...requests.map((r) => ({ id: `receipt-${r.id}`, at: r.recordedAt, userName: names.user(r.userId), summary: { key: "summaries.receiptRequest", values: request(r) } })),
    ...outcomes.map(({ o, r }) => ({
      id: `outcome-${o.id}`,
      at: o.recordedAt,
      userName: names.user(o.userId),
      summary: { key: `summaries.receiptOutcome.${o.outcome}`, values: { ...request(r), reason: o.reason || "—" } },
    })),
  ];
}
