import "server-only";
import { desc } from "drizzle-orm";
import { auditLog } from "@/db/schema";
import { getDb } from "../platform/db";
import type { AuditNames } from "./audit-names";
import type { AuditItem, AuditValue } from "./audit-sources";

/**
 * The catalogue key of an audit_log action: audit.actions.<action with dots as "_">, since a
 * dot in a catalogue key means nesting. Any action written with recordAudit plugs in by having
 * that key; its detail's plain values become the summary's values (see detailValues).
 */
export const actionSummaryKey = (action: string) => `actions.${action.replaceAll(".", "_")}`;

// Detail keys whose values are catalogue words, not free text.
const LABELLED: Record<string, string> = { role: "roles", kind: "parties.kinds", via: "audit.via", from: "roles", to: "roles" };

/**
 * A detail object → summary values: ids become names (growerId → grower), enum words become
 * their catalogue labels, *Yen amounts money, before/after a list of changes. Nested objects
 * and ids with no name are left out, so no JSON and no id reaches the reader.
 */
export function detailValues(detail: Record<string, unknown>, names: AuditNames, subject = ""): Record<string, AuditValue> {
  const out: Record<string, AuditValue> = {};
  for (const [key, value] of Object.entries(detail)) {
    if (key === "before" || key === "after" || key === "changed" || key === "change") continue;
    if (/(^id$|Id$|^reverses$)/.test(key)) {
      if (typeof value === "string") out[key.replace(/Id$/, "")] = names.subject(value);
      continue;
    }
    if (typeof value === "number") out[key] = key.endsWith("Yen") ? { yen: value } : value;
    else if (typeof value === "string") out[key] = LABELLED[key] ? { label: `${LABELLED[key]}.${value}` } : value;
    else if (Array.isArray(value) && value.every((v) => typeof v === "string" || typeof v === "number")) out[key] = value.join(", ");
  }
  out.changes = changes(detail, subject);
  return out;
}

/** What a before/after pair (or a list of changed settings) says changed, field by field. */
function changes(detail: Record<string, unknown>, subject: string): AuditValue {
  // A list kept as one setting (tank register, varieties): the entry named and what became of it.
  if (Array.isArray(detail.after)) {
    const entry = Object.entries(detail).find(([k, v]) => !["before", "after", "change"].includes(k) && typeof v === "string");
    return [{ field: subject, change: (entry?.[1] as string | undefined) ?? "", word: typeof detail.change === "string" ? `audit.listChanges.${detail.change}` : undefined }];
  }
  const before = (detail.before ?? {}) as Record<string, unknown>;
  const after = (detail.after ?? {}) as Record<string, unknown>;
  const keys = Array.isArray(detail.changed) ? (detail.changed as string[]) : Object.keys(after).filter((k) => JSON.stringify(before[k]) !== JSON.stringify(after[k]) && k in before);
  const plain = (v: unknown) => (v == null || v === "" ? "—" : typeof v === "object" ? null : String(v));
  const list: AuditValue[] = keys.map((k) => {
    const [b, a] = [plain(before[k]), plain(after[k])];
    return { field: k, change: b !== null && a !== null && k in after ? `${b} → ${a}` : "" };
  });
  return list.length ? list : "—";
}

export function auditLogItems(names: AuditNames, limit: number): AuditItem[] {
  return getDb().select().from(auditLog).orderBy(desc(auditLog.id)).limit(limit).all().map((row) => {
    let detail: Record<string, unknown> = {};
    try {
      detail = JSON.parse(row.detail) as Record<string, unknown>;
    } catch {
      // An unreadable detail still leaves who, when and what.
    }
    const values = { subject: names.subject(row.subject), reason: "—", ...detailValues(detail, names, row.subject) };
    return { id: `log-${row.id}`, at: row.at, userName: names.user(row.userId), summary: { key: actionSummaryKey(row.action), values } };
  });
}
