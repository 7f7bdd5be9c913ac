import "server-only";
import { eq } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { parties, supplierEntries } from "@/db/schema";
import { can } from "@/domain/permissions";
import { noonOn } from "@/lib/validation/csv";
import type { Translate } from "@/lib/validation/field-errors";
import { adjustmentSchema, invoiceNumberSchema, parseSupplierInput } from "@/lib/validation/suppliers";
import { recordAudit } from "../records/audit";
import { getDb } from "../platform/db";
import { breweryTimeZone } from "../platform/settings";
import { forbidden, invalid } from "../platform/errors";
import type { SessionUser } from "../accounts/session";
import { ledgerOf, requireSupplier } from "./supplier-ledger";

// The office's own entries on a supplier's account, appended like every entry: a wrong one is
// put right by a new entry with its reason, never by editing it. Payments and their reversals
// are in supplier-payments.ts.

/**
 * An adjustment with its reason: positive when the brewery owes more. At 8 % or 10 % it is a
 * taxable amount (a price correction) and joins that rate's sum on the next statement; at 0 it
 * is stated as it stands.
 */
export function recordAdjustment(actor: SessionUser, partyId: string, raw: unknown, t: Translate, db: DbOrTx = getDb()) {
  if (!can(actor, "ledger:manage")) throw forbidden();
  const input = parseSupplierInput(adjustmentSchema, raw, t, (f) => invalid(f));
  return db.transaction((tx) => {
    requireSupplier(tx, partyId);
    const id = tx
      .insert(supplierEntries)
      .values({ partyId, kind: "adjustment", at: new Date(noonOn(input.date, breweryTimeZone(tx))), amountYen: input.amountYen, taxRatePct: input.taxRatePct, reason: input.reason, userId: actor.id, recordedAt: new Date() })
      .returning({ id: supplierEntries.id })
      .get().id;
    return { id, balanceYen: ledgerOf(tx, partyId).balanceYen };
  });
}

/** Master data: the audit log keeps the number it replaced. Empty clears it. */
export function setInvoiceNumber(actor: SessionUser, partyId: string, raw: unknown, t: Translate) {
  if (!can(actor, "parties:manage") || !can(actor, "ledger:manage")) throw forbidden();
  const { invoiceNumber } = parseSupplierInput(invoiceNumberSchema, raw, t, (f) => invalid(f));
  return getDb().transaction((tx) => {
    const before = requireSupplier(tx, partyId).invoiceNumber;
    tx.update(parties).set({ invoiceNumber: invoiceNumber || null }).where(eq(parties.id, partyId)).run();
    recordAudit(tx, { userId: actor.id, action: "party.updated", subject: partyId, detail: { before: { invoiceNumber: before }, after: { invoiceNumber: invoiceNumber || null } } });
    return { invoiceNumber: invoiceNumber || null };
  });
}
