"use client";

import { useActionState } from "react";
import { useTranslations } from "next-intl";
import { ScanCodeInput } from "@/components/floor/code-field";
import { FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { initialFormState } from "@/lib/form-state";
import { confirmReceiptAction, declineReceiptAction, dispatchLotAction } from "./actions";

export function DispatchForm({ code, receivers }: { code: string; receivers: { id: string; name: string }[] }) {
  const t = useTranslations("dispatch");
  const [state, action, pending] = useActionState(dispatchLotAction, initialFormState);
  const v = (k: string, fallback = "") => (state.ok ? fallback : (state.values?.[k] ?? fallback));
  return (
    <form action={action} className="grid gap-4 sm:grid-cols-2" noValidate key={state.ok ? `ok-${state.message}` : "form"}>
      <div className="sm:col-span-2"><FormMessage state={state} /></div>
      <ScanCodeInput id="code" name="code" label={t("code")} required defaultValue={v("code", code)} errors={state.fields?.code ?? state.fields?.["inputs.0.lot"] ?? state.fields?.["inputs.0.quantity"]} />
      <label>
        <span className="field-label">{t("to")}</span>
        <select name="counterpartyId" className="field-input" defaultValue={v("counterpartyId")}>
          {receivers.map((p) => <option key={p.id} value={p.id}>{p.name}</option>)}
        </select>
        {state.fields?.counterpartyId?.map((m) => <span key={m} className="field-error">{m}</span>)}
      </label>
      <FormField label={t("slip")} name="referenceDoc" required defaultValue={v("referenceDoc")} errors={state.fields?.referenceDoc} />
      <FormField label={t("at")} name="date" type="date" defaultValue={v("date")} errors={state.fields?.date ?? state.fields?.at} />
      <div className="sm:col-span-2"><button type="submit" className="btn" disabled={pending}>{t("record")}</button></div>
    </form>
  );
}

/** One receipt awaiting this sender's word: confirm it (dispatch and receipt at once) or decline it with a reason. */
export function AnswerRequest({ id }: { id: number }) {
  const t = useTranslations("dispatch");
  const [confirmed, confirm, confirming] = useActionState(confirmReceiptAction, initialFormState);
  const [declined, decline, declining] = useActionState(declineReceiptAction, initialFormState);
  return (
    <div className="flex flex-wrap items-start gap-3">
      <form action={confirm}>
        <input type="hidden" name="requestId" value={id} />
        <button type="submit" className="btn" disabled={confirming}>{t("confirm")}</button>
        <FormMessage state={confirmed} />
      </form>
      <form action={decline} className="flex flex-wrap items-start gap-2">
        <input type="hidden" name="requestId" value={id} />
        <FormField label={t("reason")} name="reason" required errors={declined.fields?.reason} />
        <button type="submit" className="btn-quiet" disabled={declining}>{t("decline")}</button>
        <FormMessage state={declined} />
      </form>
    </div>
  );
}
