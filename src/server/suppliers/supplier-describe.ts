import "server-only";
import type { Translate } from "@/lib/validation/field-errors";
import type { EntryRow, Ledger } from "./supplier-ledger";

type DeliveryDetail = { kg: number; bags: number; grade: string | null; variety: string | null; cropYear: number | null; moisturePct: number | null; pricePerBagYen: number; moistureSteps: number; deductionPerBagYen: number; slip?: string };
type FeeDetail = { brownKg: number; targetPolishingRatioPct: number; feePerKgYen: number };

const n = (value: number, digits = 0) => new Intl.NumberFormat("en-US", { maximumFractionDigits: digits }).format(value);

/** One line of a statement or an account in words: what was delivered or done, and at what price. */
export function describeEntry(e: Pick<EntryRow, "kind" | "detail" | "lotCode" | "reference" | "reason" | "method">, t: Translate): string {
  const detail = JSON.parse(e.detail) as Record<string, unknown>;
  switch (e.kind) {
    case "delivery": {
      const d = detail as DeliveryDetail;
      const base = t("suppliers.describe.delivery", {
        variety: d.variety ?? "",
        cropYear: d.cropYear ?? "",
        grade: d.grade ? t(`lot.grades.${d.grade}`) : "",
        lot: e.lotCode ?? "",
        kg: n(d.kg, 1),
        bags: n(d.bags, 2),
        // The number the reader sees picks the plural: 1.004 bags shows "1" and reads "1 bag".
        bagCount: Math.round(d.bags * 100) / 100,
        price: n(d.pricePerBagYen),
      });
      return d.moistureSteps > 0 ? `${base} ${t("suppliers.describe.moisture", { moisture: n(d.moisturePct ?? 0, 1), deduction: n(d.deductionPerBagYen) })}` : base;
    }
    case "polishing-fee": {
      const d = detail as FeeDetail;
      return t("suppliers.describe.polishing", { lot: e.lotCode ?? e.reference, kg: n(d.brownKg, 1), target: n(d.targetPolishingRatioPct, 1), fee: n(d.feePerKgYen) });
    }
    case "reversal":
      return t("suppliers.describe.reversal", { what: t(`suppliers.reversesKinds.${String(detail.reverses ?? "delivery")}`), lot: e.lotCode ?? e.reference, reason: e.reason });
    case "payment": {
      const paid = t("suppliers.describe.payment", { method: t(`suppliers.methods.${e.method || "other"}`), reference: e.reference || "—" });
      // Paid over the balance owed: the confirming reason goes wherever the payment is shown.
      return typeof detail.owedBeforeYen === "number" ? `${paid}; ${t("suppliers.describe.overpaid", { owed: n(detail.owedBeforeYen), reason: e.reason })}` : paid;
    }
    case "adjustment":
      return t("suppliers.describe.adjustment", { reason: e.reason });
  }
}

/** `payment`: a payment or a payment's reversal, the lines a supplier's list of payments shows. */
export type AccountRow = { key: string; at: Date; kind: string; description: string; lot: string | null; taxRatePct: number; amountYen: number; statement: string | null; payment: boolean };

/** The account's lines for a table: entries in words, tax lines named by statement and rate. */
export function accountRows(ledger: Ledger, t: Translate): AccountRow[] {
  const byId = new Map(ledger.entries.map((e) => [e.id, e]));
  return ledger.lines.map((l, n) => {
    const e = l.entryId === null ? null : byId.get(l.entryId)!;
    const description = e
      ? describeEntry(e, t)
      : l.statement
        ? t("suppliers.taxRef", { rate: l.taxRatePct, statement: l.statement })
        : t("suppliers.taxOpenRef", { rate: l.taxRatePct });
    const payment = e?.kind === "payment" || (e?.kind === "reversal" && JSON.parse(e.detail).reverses === "payment");
    return { key: `${l.entryId ?? "tax"}-${n}`, at: l.at, kind: l.kind, description, lot: e?.lotCode ?? null, taxRatePct: l.taxRatePct, amountYen: l.amountYen, statement: l.statement, payment };
  });
}
