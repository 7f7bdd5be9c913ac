"use server";

import { formValues, type FormState } from "@/lib/form-state";
import { forgotPasswordSchema } from "@/lib/validation/auth";
import { actionClientKey, actionOrigin, guardAction } from "@/server/platform/action";
import { requestPasswordReset } from "@/server/accounts/users";

export async function forgotPasswordAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const { email } = forgotPasswordSchema.parse(values);
    // Throttled on counters of its own (per address and per client), not as failed sign-ins.
    await requestPasswordReset(email, await actionClientKey(), await actionOrigin(), t);
    return { ok: true, message: t("auth.linkSent") };
  });
}
