"use client";

import { useActionState } from "react";
import { useTranslations } from "next-intl";
import { FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { initialFormState } from "@/lib/form-state";
import { signInAction } from "./actions";

export function SignInForm({ next }: { next?: string }) {
  const t = useTranslations("auth");
  const [state, action, pending] = useActionState(signInAction, initialFormState);
  return (
    <form action={action} className="space-y-4" noValidate>
      <FormMessage state={state} />
      {next ? <input type="hidden" name="next" value={next} /> : null}
      <FormField label={t("email")} name="email" type="email" autoComplete="username" required defaultValue={state.values?.email} errors={state.fields?.email} />
      <FormField label={t("password")} name="password" type="password" autoComplete="current-password" required errors={state.fields?.password} />
      <button type="submit" className="btn w-full py-3 text-lg" disabled={pending}>
        {t("signIn")}
      </button>
    </form>
  );
}
