"use client";

import { useActionState } from "react";
import { useTranslations } from "next-intl";
import { FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { initialFormState, type FormState } from "@/lib/form-state";
import { issueStatementAction, recordAdjustmentAction, setInvoiceNumberAction } from "./actions";

type Action = (prev: FormState, formData: FormData) => Promise<FormState>;

const GRID = { 1: ["grid gap-4", ""], 2: ["grid gap-4 sm:grid-cols-2", "sm:col-span-2"], 3: ["grid gap-4 sm:grid-cols-3", "sm:col-span-3"] } as const;

/** What every supplier form has around its fields: the party, the form's message, and one submit button across the grid. */
export function SupplierForm({ form, partyId, testId, columns, submit, children }: { form: ReturnType<typeof useSupplierForm>; partyId: string; testId: string; columns: 1 | 2 | 3; submit: string; children: React.ReactNode }) {
  const [grid, span] = GRID[columns];
  return (
    <form action={form.run} key={form.key} className={grid} noValidate data-testid={testId}>
      <input type="hidden" name="partyId" value={partyId} />
      <div className={span}><FormMessage state={form.state} /></div>
      {children}
      <div className={span}><button type="submit" className="btn" disabled={form.pending}>{submit}</button></div>
    </form>
  );
}

/** One form's state, with values kept after an error and cleared after a success. */
export function useSupplierForm(action: Action) {
  const [state, run, pending] = useActionState(action, initialFormState);
  const v = (k: string, d = "") => (state.ok ? d : (state.values?.[k] ?? d));
  return { state, run, pending, v, key: state.ok ? `ok-${state.message}` : "form" };
}

/** A labelled select with its errors beside it. */
export const Select = ({ label, name, value, options, errors }: { label: string; name: string; value: string; options: [string, string][]; errors?: string[] }) => (
  <div>
    <label htmlFor={name} className="field-label">{label}</label>
    <select id={name} name={name} className="field-input" defaultValue={value}>
      {options.map(([v, l]) => <option key={v} value={v}>{l}</option>)}
    </select>
    {errors?.length ? <p className="field-error">{errors.join(" ")}</p> : null}
  </div>
);

export function InvoiceNumberForm({ partyId, current }: { partyId: string; current: string }) {
  const t = useTranslations("suppliers.detail");
  const f = useSupplierForm(setInvoiceNumberAction);
  return (
    <form action={f.run} className="flex flex-wrap items-end gap-3" noValidate data-testid="invoice-form">
      <input type="hidden" name="partyId" value={partyId} />
      <div className="w-full"><FormMessage state={f.state} /></div>
      <FormField label={t("invoice")} name="invoiceNumber" defaultValue={f.v("invoiceNumber", current)} errors={f.state.fields?.invoiceNumber} placeholder="T1234567890123" className="field-input font-[family-name:var(--font-code)]" />
      <button type="submit" className="btn" disabled={f.pending}>{t("saveInvoice")}</button>
    </form>
  );
}

export function AdjustmentForm({ partyId, today }: { partyId: string; today: string }) {
  const t = useTranslations("suppliers");
  const f = useSupplierForm(recordAdjustmentAction);
  return (
    <SupplierForm form={f} partyId={partyId} testId="adjustment-form" columns={2} submit={t("adjustment.save")}>
      <FormField label={t("adjustment.date")} name="adjDate" type="date" defaultValue={f.v("adjDate", today)} errors={f.state.fields?.date} />
      <FormField label={t("adjustment.amount")} name="adjAmount" inputMode="numeric" defaultValue={f.v("adjAmount")} errors={f.state.fields?.amountYen} />
      <Select label={t("adjustment.rate")} name="adjRate" value={f.v("adjRate", "0")} options={["0", "8", "10"].map((r) => [r, t(`rates.${r}`)])} errors={f.state.fields?.taxRatePct} />
      <FormField label={t("adjustment.reason")} name="adjReason" defaultValue={f.v("adjReason")} errors={f.state.fields?.reason} />
    </SupplierForm>
  );
}

export function StatementForm({ partyId, from, to, hasEmail }: { partyId: string; from: string; to: string; hasEmail: boolean }) {
  const t = useTranslations("suppliers.statements");
  const f = useSupplierForm(issueStatementAction);
  return (
    <SupplierForm form={f} partyId={partyId} testId="statement-form" columns={3} submit={t("issue")}>
      <FormField label={t("from")} name="from" type="date" defaultValue={f.v("from", from)} errors={f.state.fields?.from} />
      <FormField label={t("to")} name="to" type="date" defaultValue={f.v("to", to)} errors={f.state.fields?.to} />
      <label className="flex items-center gap-2 self-end pb-2">
        <input type="checkbox" name="email" defaultChecked={hasEmail} disabled={!hasEmail} />
        {t("email")}
      </label>
      {f.state.fields?.email ? <p className="field-error sm:col-span-3">{f.state.fields.email.join(" ")}</p> : null}
    </SupplierForm>
  );
}
