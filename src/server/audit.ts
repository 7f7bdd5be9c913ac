import "server-only";
import { desc, eq } from "drizzle-orm";
import { auditLog, users } from "@/db/schema";
import type { DbOrTx } from "@/db/client";
import { getDb } from "./db";

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

/** Appends who did what; called inside the same transaction as the change it records. */
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

/** The audit log with each actor's name, newest first. */
export function listAudit(limit = 500) {
  return getDb()
    .select({ id: auditLog.id, at: auditLog.at, userName: users.name, action: auditLog.action, subject: auditLog.subject, detail: auditLog.detail })
    .from(auditLog)
    .leftJoin(users, eq(users.id, auditLog.userId))
    .orderBy(desc(auditLog.id))
    .limit(limit)
    .all()
    .map((row) => ({ ...row, userName: row.userName ?? "—" }));
}
