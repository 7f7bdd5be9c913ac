"use client";

import { useActionState } from "react";
import { useTranslations } from "next-intl";
import { ScanCodeInput } from "@/components/floor/code-field";
import { FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { initialFormState } from "@/lib/form-state";
import { receiveLotAction } from "./actions";

export function ReceiveForm({ receivers }: { receivers: { id: string; name: string }[] | null }) {
  const t = useTranslations("receive");
  const [state, action, pending] = useActionState(receiveLotAction, initialFormState);
  const v = (k: string) => (state.ok ? "" : (state.values?.[k] ?? ""));
  return (
    <form action={action} className="grid gap-4 sm:grid-cols-2" noValidate key={state.ok ? `ok-${state.message}` : "form"}>
      <div className="sm:col-span-2"><FormMessage state={state} /></div>
      <ScanCodeInput id="code" name="code" label={t("code")} required defaultValue={v("code")} errors={state.fields?.code ?? state.fields?.["inputs.0.lot"]} />
      <FormField label={t("arrivalKg")} name="quantity" inputMode="decimal" required defaultValue={v("quantity")} errors={state.fields?.quantity ?? state.fields?.["inputs.0.quantity"]} />
      <FormField label={t("slip")} name="referenceDoc" defaultValue={v("referenceDoc")} errors={state.fields?.referenceDoc} />
      <FormField label={t("place")} name="place" defaultValue={v("place")} errors={state.fields?.place} />
      <FormField label={t("at")} name="date" type="date" defaultValue={v("date")} errors={state.fields?.date ?? state.fields?.at} />
      {receivers ? (
        <label>
          <span className="field-label">{t("onBehalf")}</span>
          <select name="partyId" className="field-input" defaultValue={v("partyId")}>
            {receivers.map((p) => <option key={p.id} value={p.id}>{p.name}</option>)}
          </select>
        </label>
      ) : null}
      <div className="sm:col-span-2"><button type="submit" className="btn" disabled={pending}>{t("record")}</button></div>
    </form>
  );
}
