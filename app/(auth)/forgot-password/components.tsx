"use client";

import { useActionState } from "react";
import { useTranslations } from "next-intl";
import { FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { initialFormState } from "@/lib/form-state";
import { forgotPasswordAction } from "./actions";

export function ForgotPasswordForm() {
  const t = useTranslations("auth");
  const [state, action, pending] = useActionState(forgotPasswordAction, initialFormState);
  return (
    <form action={action} className="space-y-4" noValidate>
      <FormMessage state={state} />
      <FormField label={t("email")} name="email" type="email" autoComplete="email" required defaultValue={state.values?.email} errors={state.fields?.email} />
      <button type="submit" className="btn w-full" disabled={pending}>
        {t("sendLink")}
      </button>
    </form>
  );
}
