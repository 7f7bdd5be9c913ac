"use client";

import { useActionState } from "react";
import { useTranslations } from "next-intl";
import { FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { initialFormState } from "@/lib/form-state";
import { shipToBuyerAction } from "./actions";

type Props = { code: string; unit: string; onHand: number; buyers: { id: string; name: string }[]; today: string };

/** A shipment to a buyer: who, when, how much and the delivery slip, each error beside its field. */
export function ShipmentForm({ code, unit, onHand, buyers, today }: Props) {
  const t = useTranslations("shipments");
  const [state, action, pending] = useActionState(shipToBuyerAction, initialFormState);
  const v = (k: string, fallback = "") => (state.ok ? fallback : (state.values?.[k] ?? fallback));
  const f = state.fields ?? {};
  return (
    <form action={action} className="grid gap-4 sm:grid-cols-2" noValidate data-testid="shipment-form" key={state.ok ? `ok-${state.message}` : "form"}>
      <div className="sm:col-span-2"><FormMessage state={state} /></div>
      <input type="hidden" name="code" value={code} />
      <div>
        <label htmlFor="ship-buyer" className="field-label">{t("buyer")}</label>
        <select id="ship-buyer" name="counterpartyId" className="field-input" defaultValue={v("counterpartyId")} aria-invalid={f.counterpartyId ? true : undefined}>
          {buyers.map((p) => <option key={p.id} value={p.id}>{p.name}</option>)}
        </select>
        {f.counterpartyId ? <p className="field-error">{f.counterpartyId.join(" ")}</p> : null}
      </div>
      <FormField id="ship-date" label={t("date")} name="date" type="date" required defaultValue={v("date", today)} errors={f.date ?? f.at} />
      <FormField id="ship-quantity" label={t("quantity", { unit })} name="quantity" inputMode="decimal" required defaultValue={v("quantity")} errors={f.quantity ?? f["inputs.0.quantity"] ?? f["inputs.0.lot"] ?? f.code} />
      <FormField id="ship-slip" label={t("slip")} name="referenceDoc" required maxLength={100} defaultValue={v("referenceDoc")} errors={f.referenceDoc} />
      <div className="sm:col-span-2"><button type="submit" className="btn" disabled={pending || buyers.length === 0}>{t("record")}</button></div>
    </form>
  );
}
