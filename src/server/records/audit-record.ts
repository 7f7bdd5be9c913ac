import "server-only";
import { receiptOutcomes, EVENT_STEPS, SUPPLIER_CONTRACT_KINDS, SUPPLIER_ENTRY_KINDS } from "@/db/schema";
import { auditLogItems } from "./audit-log-items";
import { loadAuditNames } from "./audit-names";
import { figureName, quantityText } from "@/lib/quantity";
import { contractItems, entryItems, eventItems, receiptItems, statementItems, type AuditItem, type AuditValue } from "./audit-sources";

/** A translator that can also say whether it has a key (next-intl's and use-intl's both can). */
export type AuditTranslate = { (key: string, values?: Record<string, string | number>): string; has(key: string): boolean };

export type AuditRecordRow = { id: string; at: Date; userName: string; summary: string };

/** The summary keys (under audit.) that the sources other than audit_log can give. */
export function sourceSummaryKeys(): string[] {
  return [
    "summaries.event",
    "summaries.handOver",
    "summaries.correcting",
    ...SUPPLIER_ENTRY_KINDS.map((k) => `summaries.entry.${k}`),
    ...SUPPLIER_CONTRACT_KINDS.map((k) => `summaries.contract.${k}`),
    "summaries.statement",
    "summaries.receiptRequest",
    ...receiptOutcomes.outcome.enumValues.map((o) => `summaries.receiptOutcome.${o}`),
  ];
}
/** Every step an event line names by its label (ledger's steps.*). */
export const AUDITED_STEPS = EVENT_STEPS;

/**
 * Everyone's records, newest first: events, supplier money, statements, contracts, receipts
 * awaiting a sender and their answers, and the audit_log (sign-ins, users, parties, fields,
 * settings, holds …). `limit` bounds each source and the merged list.
 */
export function auditRecord(limit = 500): AuditItem[] {
  const names = loadAuditNames();
  const sources = [auditLogItems, eventItems, entryItems, statementItems, contractItems, receiptItems];
  return sources
    .flatMap((items) => items(names, limit))
    .sort((a, b) => b.at.getTime() - a.at.getTime() || b.id.localeCompare(a.id))
    .slice(0, limit);
}

/** Words each line from the catalogue, with its values formatted for the reader. */
export function renderAudit(items: AuditItem[], t: AuditTranslate, locale = "en"): AuditRecordRow[] {
  const yen = new Intl.NumberFormat(locale, { style: "currency", currency: "JPY" });
  const word = (v: AuditValue): string => {
    if (Array.isArray(v)) return v.map(word).join("; ");
    if (typeof v === "string") return v;
    if (typeof v === "number") return String(v);
    if ("yen" in v) return yen.format(v.yen);
    if ("label" in v) return t.has(v.label) ? t(v.label) : "—";
    if ("lots" in v) return v.lots.map((l) => (l.quantity === null ? l.code : `${l.code} (${quantityText(t, locale, l.quantity, l.unit, 2)})`)).join(", ");
    // A field the audit catalogue does not name reads as a figure's name, never as its key.
    const label = t.has(`audit.fields.${v.field}`) ? t(`audit.fields.${v.field}`) : figureName(t, v.field);
    const change = [v.change, v.word && t.has(v.word) ? t(v.word) : ""].filter(Boolean).join(" ");
    return change ? `${label}: ${change}` : label;
  };
  return items.map((item) => {
    const key = `audit.${item.summary.key}`;
    const values = Object.fromEntries(Object.entries(item.summary.values).map(([k, v]) => [k, word(v)]));
    return { id: item.id, at: item.at, userName: item.userName, summary: t.has(key) ? t(key, values) : t("audit.unknownAction") };
  });
}
