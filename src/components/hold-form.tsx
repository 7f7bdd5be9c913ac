"use client";

import { useActionState } from "react";
import { useTranslations } from "next-intl";
import { FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { initialFormState, type FormState } from "@/lib/form-state";

type Props = {
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  code: string;
  /** Distinguishes the reason fields of two forms on one page. */
  id: string;
  submit: string;
  tone?: "warn" | "quiet";
};

/** A hold or a release: the lot (or recall) code and a reason, which the server requires. */
export function HoldForm({ action, code, id, submit, tone = "quiet" }: Props) {
  const t = useTranslations("holds");
  const [state, run, pending] = useActionState(action, initialFormState);
  return (
    <form action={run} className="space-y-3" noValidate data-testid={`${id}-form`} key={state.ok ? `ok-${state.message}` : "form"}>
      <FormMessage state={state} />
      <input type="hidden" name="code" value={code} />
      <FormField id={`${id}-reason`} label={t("reason")} name="reason" required minLength={3} maxLength={500} defaultValue={state.ok ? "" : state.values?.reason} errors={state.fields?.reason ?? state.fields?.code} />
      <p className="text-sm text-ink-soft">{t("reasonHint")}</p>
      <button type="submit" className={tone === "warn" ? "btn bg-persimmon" : "btn-quiet"} disabled={pending}>{submit}</button>
    </form>
  );
}
