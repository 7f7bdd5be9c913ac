"use client";

import { useState } from "react";
import { useTranslations } from "next-intl";
import { useYen } from "@/components/supplier-account";
import { FormField } from "@/components/ui/form-field";
import { parseTypedNumber } from "@/domain/typed-input";
import { PAYMENT_METHODS } from "@/domain/money";
import { recordPaymentAction, reversePaymentAction } from "./actions";
import { Select, SupplierForm, useSupplierForm } from "./components";

/** What the form reads as yen: as people type it ("1,260", full width), the server's own rule. */
const typedYen = (v: string) => parseTypedNumber(v);

/**
 * A payment. Above the balance owed the form warns at once, with the balance, and asks for the
 * confirming reason; the server checks again (the balance may have moved meanwhile).
 */
export function PaymentForm({ partyId, today, balanceYen }: { partyId: string; today: string; balanceYen: number }) {
  const t = useTranslations("suppliers");
  const yen = useYen();
  const f = useSupplierForm(recordPaymentAction);
  // What is typed, for the form as it stands (a recorded payment clears the form).
  const [typing, setTyping] = useState<{ form: string; amount: string } | null>(null);
  const typed = typedYen(typing?.form === f.key ? typing.amount : f.v("payAmount"));
  const over = (typed !== null && typed > balanceYen) || Boolean(f.state.fields?.overpaymentReason);
  return (
    <SupplierForm form={f} partyId={partyId} testId="payment-form" columns={2} submit={t("payment.save")}>
      <p className="text-sm text-ink-soft sm:col-span-2" data-testid="payment-owed">{t("payment.owed", { balance: yen(balanceYen) })}</p>
      <FormField label={t("payment.date")} name="payDate" type="date" defaultValue={f.v("payDate", today)} errors={f.state.fields?.date} />
      <FormField label={t("payment.amount")} name="payAmount" inputMode="numeric" defaultValue={f.v("payAmount")} errors={f.state.fields?.amountYen} onChange={(e) => setTyping({ form: f.key, amount: e.target.value })} />
      <Select label={t("payment.method")} name="payMethod" value={f.v("payMethod", "bank-transfer")} options={PAYMENT_METHODS.map((m) => [m, t(`methods.${m}`)])} errors={f.state.fields?.method} />
      <FormField label={t("payment.reference")} name="payReference" defaultValue={f.v("payReference")} errors={f.state.fields?.reference} />
      {over ? (
        <div className="space-y-2 sm:col-span-2" data-testid="overpayment">
          {typed !== null && typed > balanceYen ? <p className="notice-warn" role="alert">{t("payment.overWarning", { excess: yen(typed - balanceYen), balance: yen(balanceYen) })}</p> : null}
          <FormField label={t("payment.overpaymentReason")} name="payOverReason" required defaultValue={f.v("payOverReason")} errors={f.state.fields?.overpaymentReason} />
        </div>
      ) : null}
    </SupplierForm>
  );
}

export type PaymentLine = { id: number; day: string; amountYen: number; description: string; reversed: boolean; statement: string | null };

/** The supplier's payments, newest first, each with its reversal form (the office only). */
export function PaymentsList({ partyId, rows }: { partyId: string; rows: PaymentLine[] }) {
  const t = useTranslations("suppliers");
  const yen = useYen();
  return (
    <ul className="divide-y divide-paper-deep" data-testid="payments-list">
      {rows.map((p) => (
        <li key={p.id} className="flex flex-wrap items-start justify-between gap-3 py-2" data-testid={`payment-${p.id}`}>
          <span>
            <span className="font-semibold">{p.day}</span> · {yen(p.amountYen)} · {p.description}
            {p.statement ? <span className="text-ink-soft"> · {p.statement}</span> : null}
          </span>
          {p.reversed ? <span className="code-chip">{t("payment.alreadyReversed")}</span> : <ReversalForm partyId={partyId} payment={p} />}
        </li>
      ))}
    </ul>
  );
}

function ReversalForm({ partyId, payment }: { partyId: string; payment: PaymentLine }) {
  const t = useTranslations("suppliers.payment");
  const yen = useYen();
  const f = useSupplierForm(reversePaymentAction);
  return (
    <details className="w-full max-w-md" open={Boolean(f.state.message && !f.state.ok) || undefined}>
      <summary className="btn-quiet cursor-pointer">{t("reverse")}</summary>
      <p className="mt-2 font-semibold">{t("reverseTitle", { amount: yen(payment.amountYen), date: payment.day })}</p>
      <p className="text-sm text-ink-soft">{t("reverseIntro")}</p>
      <SupplierForm form={f} partyId={partyId} testId={`reversal-form-${payment.id}`} columns={1} submit={t("reverseSave")}>
        <input type="hidden" name="entryId" value={payment.id} />
        <FormField label={t("reversalReason")} name="reversalReason" required defaultValue={f.v("reversalReason")} errors={f.state.fields?.reason} />
      </SupplierForm>
    </details>
  );
}
