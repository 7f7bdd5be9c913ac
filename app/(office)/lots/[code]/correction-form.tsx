"use client";

import { useActionState } from "react";
import { useFormatter, useTranslations } from "next-intl";
import { FormMessage } from "@/components/ui/form-message";
import { initialFormState } from "@/lib/form-state";
import { correctEventAction } from "./actions";

export function CorrectionForm({ code, events }: { code: string; events: { id: number; step: string; at: string }[] }) {
  const t = useTranslations();
  const format = useFormatter();
  const [state, action, pending] = useActionState(correctEventAction, initialFormState);
  return (
    <form action={action} className="space-y-4" noValidate>
      <FormMessage state={state} />
      <input type="hidden" name="code" value={code} />
      <div>
        <label htmlFor="corrects" className="field-label">{t("lotPage.event")}</label>
        <select id="corrects" name="corrects" className="field-input">
          {events.map((e) => (
            <option key={e.id} value={e.id}>{`#${e.id} ${t(`steps.${e.step}`)} — ${format.dateTime(new Date(e.at), "day")}`}</option>
          ))}
        </select>
        {state.fields?.corrects ? <p className="field-error">{state.fields.corrects.join(" ")}</p> : null}
      </div>
      <div>
        <label htmlFor="reason" className="field-label">{t("lotPage.reason")}</label>
        <textarea id="reason" name="reason" rows={2} maxLength={500} className="field-input" aria-invalid={state.fields?.reason ? true : undefined} />
        {state.fields?.reason ? <p className="field-error">{state.fields.reason.join(" ")}</p> : null}
      </div>
      <button type="submit" className="btn bg-persimmon" disabled={pending}>{t("lotPage.correct")}</button>
    </form>
  );
}
