import "server-only";
import { asc, desc, eq, like } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { parties, supplierStatementEntries, supplierStatements, users } from "@/db/schema";
import { can } from "@/domain/permissions";
import { taxByRate } from "@/domain/tax";
import { dayIn, nextDay, startOfDayIn } from "@/i18n/dates";
import type { Translate } from "@/lib/validation/field-errors";
import { parseSupplierInput, statementSchema } from "@/lib/validation/suppliers";
import { getDb } from "../platform/db";
import { breweryTimeZone } from "../platform/settings";
import { AppError, forbidden, invalid, notFound } from "../platform/errors";
import type { SessionUser } from "../accounts/session";
import { computeLedger, entriesOf, loadAccount, requireReadableSupplier, requireSupplier, type EntryRow, type StatementTotals } from "./supplier-ledger";
import { readTaxRounding } from "./supplier-settings";

/** Statement numbers run per calendar year of issue on the brewery's clock: S-2026-0001, S-2026-0002 … */
function nextNumber(tx: DbOrTx, issuedAt: Date): string {
  const prefix = `S-${dayIn(issuedAt, breweryTimeZone(tx)).slice(0, 4)}-`;
  const last = tx.select({ n: supplierStatements.number }).from(supplierStatements).where(like(supplierStatements.number, `${prefix}%`)).orderBy(desc(supplierStatements.number)).get()?.n;
  return `${prefix}${String((last ? Number(last.slice(prefix.length)) : 0) + 1).padStart(4, "0")}`;
}

/**
 * Issues a statement (the brewery's purchase statement to its supplier): it covers every entry
 * of the period that no statement has covered yet, and its tax is computed once per rate on the
 * sums, by the rounding rule in force, and frozen with it. An entry dated in a period already
 * stated (recorded late) waits for the next statement whose period holds it.
 */
export function issueStatement(actor: SessionUser, partyId: string, raw: unknown, t: Translate, db: DbOrTx = getDb(), issuedAt = new Date()) {
  if (!can(actor, "ledger:manage")) throw forbidden();
  const input = parseSupplierInput(statementSchema, raw, t, (f) => invalid(f));
  return db.transaction((tx) => {
    const zone = breweryTimeZone(tx);
    const from = startOfDayIn(input.from, zone);
    const before = startOfDayIn(nextDay(input.to), zone);
    const party = requireSupplier(tx, partyId);
    if (input.email && !party.email) throw invalid({ email: [t("suppliers.validation.noEmail")] });
    const account = loadAccount(tx, partyId);
    const covered = account.entries.filter((e) => e.statement === null && e.at >= from && e.at < before);
    if (!covered.length) throw invalid({ from: [t("suppliers.validation.nothingToState")] });
    const rounding = readTaxRounding(tx);
    const tax = taxByRate(covered, rounding);
    const sum = (list: EntryRow[]) => list.reduce((a, e) => a + e.amountYen, 0);
    const totals: StatementTotals = {
      rounding,
      ...tax,
      // A payment's reversal counts against the payments (it may state a payment of an earlier statement).
      paymentsYen: sum(covered.filter((e) => e.kind === "payment" || (e.kind === "reversal" && e.taxRatePct === 0 && JSON.parse(e.detail).reverses === "payment"))),
      adjustmentsYen: sum(covered.filter((e) => e.kind === "adjustment" && e.taxRatePct === 0)),
    };
    const number = nextNumber(tx, issuedAt);
    // The balance once this statement stands, as of its issue: its tax replaces the provisional tax on what it covers.
    const ids = new Set(covered.map((e) => e.id));
    const after: typeof account = { ...account, entries: account.entries.map((e) => (ids.has(e.id) ? { ...e, statement: number } : e)), statements: [...account.statements, { number, issuedAt, totals }] };
    const balanceYen = computeLedger(after, rounding, issuedAt, issuedAt).balanceYen;
    const id = tx
      .insert(supplierStatements)
      .values({ number, partyId, fromDay: input.from, toDay: input.to, rounding, totals: JSON.stringify(totals), balanceYen, userId: actor.id, issuedAt })
      .returning({ id: supplierStatements.id })
      .get().id;
    tx.insert(supplierStatementEntries).values(covered.map((e) => ({ statementId: id, entryId: e.id }))).run();
    if (computeLedger(loadAccount(tx, partyId), rounding, issuedAt, issuedAt).balanceYen !== balanceYen) throw new AppError("conflict", "errors.statementUnreconciled");
    return { id, number, totals, balanceYen, email: input.email };
  });
}

export type StatementView = NonNullable<ReturnType<typeof loadStatement>>;

function loadStatement(db: DbOrTx, number: string) {
  const row = db
    .select({ s: supplierStatements, issuer: parties.name })
    .from(supplierStatements)
    .innerJoin(users, eq(users.id, supplierStatements.userId))
    .innerJoin(parties, eq(parties.id, users.partyId))
    .where(eq(supplierStatements.number, number))
    .get();
  if (!row) return null;
  const supplier = db.select().from(parties).where(eq(parties.id, row.s.partyId)).get()!;
  const ids = new Set(db.select({ id: supplierStatementEntries.entryId }).from(supplierStatementEntries).where(eq(supplierStatementEntries.statementId, row.s.id)).all().map((r) => r.id));
  const entries = entriesOf(db, row.s.partyId).filter((e) => ids.has(e.id));
  return {
    number: row.s.number,
    from: row.s.fromDay,
    to: row.s.toDay,
    issuedAt: row.s.issuedAt,
    issuer: row.issuer,
    supplier: { id: supplier.id, name: supplier.name, kind: supplier.kind, email: supplier.email, address: supplier.address, invoiceNumber: supplier.invoiceNumber },
    totals: JSON.parse(row.s.totals) as StatementTotals,
    balanceYen: row.s.balanceYen,
    entries,
  };
}

/** One statement of one supplier: the office and auditors any, a supplier only its own (another's: 404, as unknown). */
export function readStatement(actor: SessionUser, partyId: string, number: string): StatementView {
  requireReadableSupplier(getDb(), actor, partyId, { key: "errors.statementNotFound", values: { number } });
  const view = loadStatement(getDb(), number);
  if (!view || view.supplier.id !== partyId) throw notFound({ key: "errors.statementNotFound", values: { number } });
  return view;
}

/** For the seed and the issuing action, which have just made it. */
export function statementByNumber(db: DbOrTx, number: string): StatementView {
  return loadStatement(db, number)!;
}

export function listStatements(partyId: string) {
  return getDb()
    .select({ number: supplierStatements.number, from: supplierStatements.fromDay, to: supplierStatements.toDay, issuedAt: supplierStatements.issuedAt, totals: supplierStatements.totals, balanceYen: supplierStatements.balanceYen })
    .from(supplierStatements)
    .where(eq(supplierStatements.partyId, partyId))
    .orderBy(asc(supplierStatements.id))
    .all()
    .map((s) => ({ ...s, grossYen: (JSON.parse(s.totals) as StatementTotals).grossYen }));
}
