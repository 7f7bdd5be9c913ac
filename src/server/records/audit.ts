import "server-only";
import { auditLog } from "@/db/schema";
import type { DbOrTx } from "@/db/client";

export type AuditAction =
  | "user.signed-in"
  | "user.signed-out"
  | "user.invited"
  | "user.password-set"
  | "user.reset-requested"
  | "user.deactivated"
  | "user.reactivated"
  | "user.role-changed"
  | "party.created"
  | "party.updated"
  | "field.created"
  | "settings.updated"
  | "product.created"
  | "payment.over-balance"
  | "payment.reversed"
  | "lot.held"
  | "lot.released";

/**
 * Appends who did what; called inside the same transaction as the change it records. The audit
 * record (src/server/records/audit-record.ts) words it from audit.actions.<action, dots as "_"> in the
 * catalogue, with the detail's plain values; tests/integration/audit-record.test.ts fails for an
 * action that has no such summary.
 */
export function recordAudit(
  db: DbOrTx,
  entry: { userId: string | null; action: AuditAction; subject: string; detail?: Record<string, unknown> },
) {
  db.insert(auditLog)
    .values({
      userId: entry.userId,
      action: entry.action,
      subject: entry.subject,
      detail: JSON.stringify(entry.detail ?? {}),
      at: new Date(),
    })
    .run();
}
