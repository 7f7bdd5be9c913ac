import "server-only";
import { and, eq } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { supplierEntries } from "@/db/schema";
import { can } from "@/domain/permissions";
import { dayIn } from "@/i18n/dates";
import { noonOn } from "@/lib/validation/csv";
import type { Translate } from "@/lib/validation/field-errors";
import { parseSupplierInput, paymentSchema, reversalSchema } from "@/lib/validation/suppliers";
import { recordAudit } from "../records/audit";
import { getDb } from "../platform/db";
import { breweryTimeZone } from "../platform/settings";
import { AppError, forbidden, invalid, notFound } from "../platform/errors";
import type { SessionUser } from "../accounts/session";
import { describeEntry } from "./supplier-describe";
import { ledgerOf, requireSupplier, type Ledger } from "./supplier-ledger";

const yen = (v: number) => new Intl.NumberFormat("en-US").format(v);

/**
 * A payment to a supplier, appended like every entry. One larger than the balance owed (tax
 * not yet stated included, as the account shows it) is most often a typing slip, so it stands
 * only with a confirming reason (an advance, a payment before the receipt is booked); the
 * reason stays with the payment and in the audit log.
 */
export function recordPayment(actor: SessionUser, partyId: string, raw: unknown, t: Translate, db: DbOrTx = getDb()) {
  if (!can(actor, "ledger:manage")) throw forbidden();
  const input = parseSupplierInput(paymentSchema, raw, t, (f) => invalid(f));
  return db.transaction((tx) => {
    requireSupplier(tx, partyId);
    const owed = ledgerOf(tx, partyId).balanceYen;
    const over = input.amountYen > owed;
    if (over && input.overpaymentReason.length < 3) {
      const values = { balance: yen(owed), amount: yen(input.amountYen) };
      throw new AppError("conflict", { key: "errors.paymentOverBalance", values }, { overpaymentReason: [t("suppliers.payment.overBalance", values)] });
    }
    const id = tx
      .insert(supplierEntries)
      .values({
        partyId,
        kind: "payment",
        at: new Date(noonOn(input.date, breweryTimeZone(tx))),
        amountYen: -input.amountYen,
        taxRatePct: 0,
        method: input.method,
        reference: input.reference,
        reason: over ? input.overpaymentReason : "",
        detail: JSON.stringify(over ? { owedBeforeYen: owed } : {}),
        userId: actor.id,
        recordedAt: new Date(),
      })
      .returning({ id: supplierEntries.id })
      .get().id;
    if (over) recordAudit(tx, { userId: actor.id, action: "payment.over-balance", subject: partyId, detail: { entryId: id, amountYen: input.amountYen, owedBeforeYen: owed, reason: input.overpaymentReason } });
    return { id, balanceYen: ledgerOf(tx, partyId).balanceYen };
  });
}

/** Entry ids in a URL: digits only; anything else names no entry. */
const entryIdOf = (raw: string) => (/^[1-9]\d{0,15}$/.test(raw) ? Number(raw) : null);

/**
 * Puts a payment right without touching it: a reversal entry of the opposite amount, with the
 * reason and the user, dated when it is recorded — so a payment already on an issued statement
 * is answered on the next one — and never before the payment itself: a payment is dated noon on
 * its day, so one reversed that morning would otherwise come first in the account. A payment is
 * reversed once. A payment of another supplier (through a mismatched party in the URL) is as
 * unknown as one that does not exist.
 */
export function reversePayment(actor: SessionUser, partyId: string, rawEntryId: string, raw: unknown, t: Translate, db: DbOrTx = getDb()) {
  if (!can(actor, "ledger:manage")) throw forbidden();
  const { reason } = parseSupplierInput(reversalSchema, raw, t, (f) => invalid(f));
  const entryId = entryIdOf(rawEntryId);
  return db.transaction((tx) => {
    requireSupplier(tx, partyId);
    const payment = entryId === null ? undefined : tx.select().from(supplierEntries).where(and(eq(supplierEntries.id, entryId), eq(supplierEntries.partyId, partyId), eq(supplierEntries.kind, "payment"))).get();
    if (!payment) throw notFound("errors.paymentNotFound");
    const done = tx.select({ id: supplierEntries.id }).from(supplierEntries).where(eq(supplierEntries.reversesEntryId, payment.id)).get();
    if (done) throw new AppError("conflict", "errors.paymentAlreadyReversed");
    const id = tx
      .insert(supplierEntries)
      .values({
        partyId,
        kind: "reversal",
        at: new Date(Math.max(Date.now(), payment.at.getTime())),
        amountYen: -payment.amountYen,
        taxRatePct: payment.taxRatePct,
        reversesEntryId: payment.id,
        method: payment.method,
        reference: payment.reference,
        reason,
        detail: JSON.stringify({ reverses: "payment" }),
        userId: actor.id,
        recordedAt: new Date(),
      })
      .returning({ id: supplierEntries.id })
      .get().id;
    recordAudit(tx, { userId: actor.id, action: "payment.reversed", subject: partyId, detail: { entryId: id, reverses: payment.id, amountYen: -payment.amountYen, reason } });
    return { id, balanceYen: ledgerOf(tx, partyId).balanceYen };
  });
}

/** The account's payments for the office's list, newest first, each marked when reversed. */
export function paymentLines(ledger: Ledger, t: Translate, timeZone = breweryTimeZone()) {
  const reversed = new Set(ledger.entries.map((e) => e.reversesEntryId));
  return ledger.entries
    .filter((e) => e.kind === "payment")
    .map((e) => ({ id: e.id, day: dayIn(e.at, timeZone), amountYen: -e.amountYen, description: describeEntry(e, t), reversed: reversed.has(e.id), statement: e.statement }))
    .reverse();
}
