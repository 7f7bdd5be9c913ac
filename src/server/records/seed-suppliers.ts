import "server-only";
import { eq } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { parties } from "@/db/schema";
import { translator } from "@/i18n/messages";
import type { Translate } from "@/lib/validation/field-errors";
import type { SessionUser } from "../accounts/session";
import { addGrowerContract, addMillContract } from "../suppliers/supplier-contracts";
import { publicOrigin } from "../platform/public-origin";
import { ledgerOf } from "../suppliers/supplier-ledger";
import { recordPayment } from "../suppliers/supplier-payments";
import { mailStatement } from "../suppliers/supplier-statement-mail";
import { issueStatement, statementByNumber } from "../suppliers/supplier-statements";

const en = translator("en");
const t: Translate = (key, values) => en(key as never, values as never);
const prices = (p: Record<string, number>) => Object.fromEntries(Object.entries(p).map(([g, v]) => [g, String(v)]));

/**
 * Invented contract terms, seeded before the seasons so that their receipts and polishing runs
 * become payables through the same hook as any other. The cooperative has no 2024 contract:
 * its 2024 delivery shows among deliveries without a contract price.
 */
export function seedSupplierContracts(tx: DbOrTx, admin: SessionUser) {
  // Invented registration numbers: a leading 0 is never a corporate number's check digit
  // (NTA corporate number rules — from memory), so none of these can be a real business's.
  // The Nakase family farm is a small business outside the invoice system: no number.
  for (const [id, invoiceNumber] of [["grower-ikeda", "T0000000000101"], ["grower-coop", "T0000000000303"], ["mill-shirotae", "T0000000000505"]]) {
    tx.update(parties).set({ invoiceNumber }).where(eq(parties.id, id!)).run();
  }
  const grower = (partyId: string, variety: string, cropYear: number, p: Record<string, number>, step: "0.1" | "1", deduction: number, note = "") =>
    addGrowerContract(admin, partyId, { variety, cropYear, prices: prices(p), moistureStepPct: step, moistureDeductionYen: deduction, note }, t, tx);
  grower("grower-ikeda", "Yamada Nishiki", 2024, { tokujo: 30_000, tokuto: 28_500, "1": 27_000, "2": 25_500, "3": 24_000 }, "0.1", 100);
  grower("grower-ikeda", "Yamada Nishiki", 2026, { tokujo: 30_500, tokuto: 29_000, "1": 26_500, "2": 25_000, "3": 23_500 }, "0.1", 100, "Offer before the harvest");
  grower("grower-ikeda", "Yamada Nishiki", 2026, { tokujo: 31_000, tokuto: 29_500, "1": 27_500, "2": 26_000, "3": 24_000 }, "0.1", 100, "Agreed after the grading results");
  grower("grower-nakase", "Omachi", 2024, { "1": 24_500, "2": 23_000, "3": 21_500 }, "1", 500);
  grower("grower-nakase", "Omachi", 2026, { "1": 25_000, "2": 23_500, "3": 22_000, "out-of-grade": 15_000 }, "1", 500);
  grower("grower-coop", "Yamada Nishiki", 2026, { tokuto: 29_000, "1": 27_000, "2": 25_500 }, "0.1", 80);
  grower("grower-coop", "Omachi", 2026, { "1": 24_800, "2": 23_300, "3": 21_800 }, "0.1", 80);
  addMillContract(admin, "mill-shirotae", { tiers: [{ upToRatioPct: 50, feePerKgYen: "60" }, { upToRatioPct: 60, feePerKgYen: "45" }, { upToRatioPct: 70, feePerKgYen: "35" }, { upToRatioPct: "", feePerKgYen: "30" }], note: "Contract polishing, per kg of brown rice in" }, t, tx);
}

const SUPPLIERS = ["grower-ikeda", "grower-nakase", "grower-coop", "mill-shirotae"] as const;

/**
 * After the seasons: the 2024 statements, issued in January 2025 and paid in full; an advance
 * to Ikeda Farm in November 2026; then one statement per supplier for autumn 2026, returned
 * so that it can be e-mailed once the seed's transaction has committed.
 */
export function seedSupplierAccounts(tx: DbOrTx, admin: SessionUser): string[] {
  for (const [n, partyId] of SUPPLIERS.entries()) {
    if (partyId === "grower-coop") continue;
    const s = issueStatement(admin, partyId, { from: "2024-10-01", to: "2024-12-31" }, t, tx, new Date(`2025-01-1${n}T10:00:00+09:00`));
    recordPayment(admin, partyId, { date: "2025-01-31", amountYen: s.totals.grossYen, method: "bank-transfer", reference: `Transfer for ${s.number}` }, t, tx);
  }
  recordPayment(admin, "grower-ikeda", { date: "2026-11-20", amountYen: 500_000, method: "bank-transfer", reference: "Advance on the 2026 harvest" }, t, tx);
  const numbers = SUPPLIERS.map((partyId) => issueStatement(admin, partyId, { from: "2026-09-01", to: "2026-11-30" }, t, tx).number);
  // The 2024 accounts are settled: only 2026 remains owed.
  for (const partyId of SUPPLIERS) if (ledgerOf(tx, partyId).balanceYen < 0) throw new Error(`seed: ${partyId} overpaid`);
  return numbers;
}

export async function mailSeededStatements(db: DbOrTx, numbers: string[]) {
  const origin = publicOrigin();
  // Kept in the outbox only: the demo's parties are invented, their addresses .example.
  for (const number of numbers) await mailStatement(statementByNumber(db, number), origin, db, { deliver: false });
}
