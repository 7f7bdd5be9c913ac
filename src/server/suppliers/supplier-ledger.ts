import "server-only";
import { asc, eq, inArray } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { lots, parties, supplierEntries, supplierStatementEntries, supplierStatements } from "@/db/schema";
import { ageBalance, type Ageing } from "@/domain/ageing";
import type { Rounding } from "@/domain/money";
import { can, canReadLedgerOf } from "@/domain/permissions";
import { taxByRate, type RateTotal } from "@/domain/tax";
import { getDb } from "../platform/db";
import { forbidden, notFound, type ErrorMessage } from "../platform/errors";
import type { SessionUser } from "../accounts/session";
import { breweryTimeZone } from "../platform/settings";
import { readTaxRounding } from "./supplier-settings";

export type EntryRow = typeof supplierEntries.$inferSelect & { lotCode: string | null; statement: string | null };
export type StatementTotals = { rounding: Rounding; rates: RateTotal[]; netYen: number; taxYen: number; grossYen: number; paymentsYen: number; adjustmentsYen: number };
export type LedgerLine = { at: Date; kind: EntryRow["kind"] | "tax"; amountYen: number; ref: string; taxRatePct: number; entryId: number | null; statement: string | null };
export type Ledger = { partyId: string; balanceYen: number; lines: LedgerLine[]; entries: EntryRow[]; openTax: RateTotal[]; ageing: Ageing };

/** Every entry of one supplier, oldest first, with the lot it is about and the statement that stated it. */
export function entriesOf(db: DbOrTx, partyId: string): EntryRow[] {
  return db
    .select({ entry: supplierEntries, lotCode: lots.code, statement: supplierStatements.number })
    .from(supplierEntries)
    .leftJoin(lots, eq(lots.id, supplierEntries.lotId))
    .leftJoin(supplierStatementEntries, eq(supplierStatementEntries.entryId, supplierEntries.id))
    .leftJoin(supplierStatements, eq(supplierStatements.id, supplierStatementEntries.statementId))
    .where(eq(supplierEntries.partyId, partyId))
    .orderBy(asc(supplierEntries.at), asc(supplierEntries.id))
    .all()
    .map((r) => ({ ...r.entry, lotCode: r.lotCode, statement: r.statement }));
}

export type StatementHead = { number: string; issuedAt: Date; totals: StatementTotals };
export type Account = { partyId: string; entries: EntryRow[]; statements: StatementHead[] };

export function loadAccount(db: DbOrTx, partyId: string): Account {
  const statements = db
    .select()
    .from(supplierStatements)
    .where(eq(supplierStatements.partyId, partyId))
    .orderBy(asc(supplierStatements.id))
    .all()
    .map((s) => ({ number: s.number, issuedAt: s.issuedAt, totals: JSON.parse(s.totals) as StatementTotals }));
  return { partyId, entries: entriesOf(db, partyId), statements };
}

function refOf(e: EntryRow): string {
  if (e.kind === "payment") return e.reference || e.method;
  if (e.kind === "adjustment") return e.reason;
  return e.lotCode ?? e.reference;
}

/**
 * A supplier's account: amounts owed incl. tax − payments ± adjustments, in whole yen. Tax is
 * a line per statement per rate, as the statement computed it; entries no statement covers yet
 * carry the tax the next statement would compute (summed per rate, rounded once, by `rounding`).
 * The lines therefore add up to the balance exactly. With `upTo`, the account as it stood then:
 * statements issued by that moment, and entries dated by then or stated by those statements.
 */
export function computeLedger(account: Account, rounding: Rounding, asOf: Date, upTo: Date | null = null, timeZone?: string): Ledger {
  const statements = upTo ? account.statements.filter((s) => s.issuedAt <= upTo) : account.statements;
  const stated = new Set(statements.map((s) => s.number));
  const entries = account.entries
    .map((e) => (e.statement && !stated.has(e.statement) ? { ...e, statement: null } : e))
    .filter((e) => !upTo || e.at <= upTo || e.statement !== null);
  const lines: LedgerLine[] = entries.map((e) => ({ at: e.at, kind: e.kind, amountYen: e.amountYen, ref: refOf(e), taxRatePct: e.taxRatePct, entryId: e.id, statement: e.statement }));
  for (const s of statements) {
    for (const r of s.totals.rates) lines.push({ at: s.issuedAt, kind: "tax", amountYen: r.taxYen, ref: `${s.number} ${r.ratePct} %`, taxRatePct: r.ratePct, entryId: null, statement: s.number });
  }
  const open = taxByRate(entries.filter((e) => e.statement === null), rounding);
  for (const r of open.rates) lines.push({ at: asOf, kind: "tax", amountYen: r.taxYen, ref: `open ${r.ratePct} %`, taxRatePct: r.ratePct, entryId: null, statement: null });
  lines.sort((a, b) => a.at.getTime() - b.at.getTime());
  const balanceYen = lines.reduce((a, l) => a + l.amountYen, 0);
  // A reversed charge and its reversal cancel out: neither is a charge still to age. Nor is a
  // reversed payment's reversal (positive) a new charge: the charges the payment settled owe again, at their age.
  const reversed = new Set(entries.map((e) => e.reversesEntryId).filter((id): id is number => id !== null));
  const charges = lines.filter((l) => l.amountYen > 0 && l.kind !== "reversal" && (l.entryId === null || !reversed.has(l.entryId)));
  return { partyId: account.partyId, balanceYen, lines, entries, openTax: open.rates, ageing: ageBalance(charges, balanceYen, asOf, timeZone) };
}

export function ledgerOf(db: DbOrTx, partyId: string, asOf = new Date()): Ledger {
  return computeLedger(loadAccount(db, partyId), readTaxRounding(db), asOf, null, breweryTimeZone(db));
}

export function requireSupplier(db: DbOrTx, partyId: string) {
  const party = db.select().from(parties).where(eq(parties.id, partyId)).get();
  if (!party || (party.kind !== "grower" && party.kind !== "mill")) throw notFound("errors.supplierNotFound");
  return party;
}

/**
 * Who reads supplier money at all: a role that reads none (brewer, sales) is refused with 403
 * whichever party it names. Another supplier's account is then unknown to a grower or a mill:
 * the same 404 as a party that does not exist, so that nobody learns which ids are suppliers.
 */
export function requireReadableSupplier(db: DbOrTx, actor: SessionUser, partyId: string, unknown: ErrorMessage | string = "errors.supplierNotFound") {
  if (!(["ledger:read-own", "ledger:read-all", "ledger:manage"] as const).some((p) => can(actor, p))) throw forbidden();
  if (!canReadLedgerOf(actor, partyId)) throw notFound(unknown);
  return requireSupplier(db, partyId);
}

/**
 * `GET /api/suppliers/{partyId}/ledger`: the office and auditors read any supplier; a grower
 * or mill only its own party. An entry's reason (a reversal's, an adjustment's) travels with it.
 */
export function readSupplierLedger(actor: SessionUser, partyId: string) {
  const db = getDb();
  requireReadableSupplier(db, actor, partyId);
  const ledger = ledgerOf(db, partyId);
  const reasons = new Map(ledger.entries.map((e) => [e.id, e.reason]));
  return {
    balanceYen: ledger.balanceYen,
    ageing: ledger.ageing,
    entries: ledger.lines.map((l) => ({ at: l.at.toISOString(), kind: l.kind, amountYen: l.amountYen, ref: l.ref, taxRatePct: l.taxRatePct, statement: l.statement, reason: (l.entryId && reasons.get(l.entryId)) || "" })),
  };
}

/** Balances and ageing of every grower and mill, for the office's list. */
export function listSupplierBalances(actor: SessionUser) {
  if (!can(actor, "ledger:read-all")) throw forbidden();
  const db = getDb();
  const suppliers = db.select().from(parties).where(inArray(parties.kind, ["grower", "mill"])).orderBy(asc(parties.kind), asc(parties.name)).all();
  return suppliers.map((p) => {
    const ledger = ledgerOf(db, p.id);
    return { id: p.id, name: p.name, kind: p.kind, invoiceNumber: p.invoiceNumber, email: p.email, balanceYen: ledger.balanceYen, ageing: ledger.ageing };
  });
}
