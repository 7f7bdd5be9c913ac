"use client";

import { useActionState } from "react";
import { useTranslations } from "next-intl";
import { FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { initialFormState } from "@/lib/form-state";
import { setPasswordAction } from "./actions";

export function SetPasswordForm({ token, email }: { token: string; email: string }) {
  const t = useTranslations("auth");
  const [state, action, pending] = useActionState(setPasswordAction, initialFormState);
  if (state.ok) return <FormMessage state={state} />;
  return (
    <form action={action} className="space-y-4" noValidate>
      <FormMessage state={state} />
      <input type="hidden" name="token" value={token} />
      {/* Lets password managers file the new password under the right account. */}
      <input type="email" name="username" value={email} autoComplete="username" readOnly hidden />
      <FormField label={t("newPassword")} name="password" type="password" autoComplete="new-password" minLength={12} required errors={state.fields?.password} />
      <FormField label={t("confirmPassword")} name="confirm" type="password" autoComplete="new-password" required errors={state.fields?.confirm} />
      {state.fields?.token ? <p className="field-error">{state.fields.token.join(" ")}</p> : null}
      <button type="submit" className="btn w-full" disabled={pending}>
        {t("savePassword")}
      </button>
    </form>
  );
}
