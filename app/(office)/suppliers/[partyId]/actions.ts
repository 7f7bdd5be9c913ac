"use server";

import { revalidatePath } from "next/cache";
import { GRADES } from "@/domain/grades";
import { formValues, type FormState } from "@/lib/form-state";
import { actionOrigin, guardAction } from "@/server/platform/action";
import { getDb } from "@/server/platform/db";
import { requireUser } from "@/server/accounts/session";
import { addGrowerContract, addMillContract } from "@/server/suppliers/supplier-contracts";
import { recordAdjustment, setInvoiceNumber } from "@/server/suppliers/supplier-office";
import { recordPayment, reversePayment } from "@/server/suppliers/supplier-payments";
import { mailStatement } from "@/server/suppliers/supplier-statement-mail";
import { issueStatement, statementByNumber } from "@/server/suppliers/supplier-statements";

const yen = (v: number) => new Intl.NumberFormat("en-US", { style: "currency", currency: "JPY" }).format(v);
const done = (partyId: string) => {
  revalidatePath(`/suppliers/${partyId}`);
  revalidatePath("/suppliers");
  revalidatePath("/account");
};

/** Each action reads the supplier from its form; the server functions check the role and the party. */
export async function setInvoiceNumberAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    setInvoiceNumber(await requireUser(), values.partyId ?? "", { invoiceNumber: values.invoiceNumber ?? "" }, t);
    done(values.partyId ?? "");
    return { ok: true, message: t("suppliers.detail.invoiceSaved") };
  });
}

export async function addGrowerContractAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const prices = Object.fromEntries(GRADES.map((g) => [g, values[`price-${g}`] ?? ""]));
    const raw = { variety: values.variety, cropYear: values.cropYear, prices, moistureStepPct: values.moistureStepPct, moistureThresholdPct: values.moistureThresholdPct ?? "", moistureDeductionYen: values.moistureDeductionYen, note: values.note ?? "" };
    const { version } = addGrowerContract(await requireUser(), values.partyId ?? "", raw, t);
    done(values.partyId ?? "");
    return { ok: true, message: t("suppliers.growerContract.saved", { version }) };
  });
}

export async function addMillContractAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const tiers = [0, 1, 2, 3].map((n) => ({ upToRatioPct: values[`tier${n}-upTo`] ?? "", feePerKgYen: values[`tier${n}-fee`] ?? "" }));
    const { version } = addMillContract(await requireUser(), values.partyId ?? "", { tiers, note: values.note ?? "" }, t);
    done(values.partyId ?? "");
    return { ok: true, message: t("suppliers.millContract.saved", { version }) };
  });
}

export async function recordPaymentAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const raw = { date: values.payDate, amountYen: values.payAmount, method: values.payMethod, reference: values.payReference ?? "", overpaymentReason: values.payOverReason ?? "" };
    const { balanceYen } = recordPayment(await requireUser(), values.partyId ?? "", raw, t);
    done(values.partyId ?? "");
    return { ok: true, message: t("suppliers.payment.saved", { balance: yen(balanceYen) }) };
  });
}

export async function reversePaymentAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const { balanceYen } = reversePayment(await requireUser(), values.partyId ?? "", values.entryId ?? "", { reason: values.reversalReason ?? "" }, t);
    done(values.partyId ?? "");
    return { ok: true, message: t("suppliers.payment.reversed", { balance: yen(balanceYen) }) };
  });
}

export async function recordAdjustmentAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const raw = { date: values.adjDate, amountYen: values.adjAmount, taxRatePct: values.adjRate, reason: values.adjReason ?? "" };
    const { balanceYen } = recordAdjustment(await requireUser(), values.partyId ?? "", raw, t);
    done(values.partyId ?? "");
    return { ok: true, message: t("suppliers.adjustment.saved", { balance: yen(balanceYen) }) };
  });
}

export async function issueStatementAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const issued = issueStatement(await requireUser(), values.partyId ?? "", { from: values.from, to: values.to, email: values.email ?? "" }, t);
    if (issued.email) await mailStatement(statementByNumber(getDb(), issued.number), await actionOrigin());
    done(values.partyId ?? "");
    return { ok: true, message: t(issued.email ? "suppliers.statements.issuedMailed" : "suppliers.statements.issued", { number: issued.number }) };
  });
}
