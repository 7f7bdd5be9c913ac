"use server";

import { formValues, type FormState } from "@/lib/form-state";
import { newPasswordSchema } from "@/lib/validation/auth";
import { actionClientKey, guardAction } from "@/server/platform/action";
import { setPasswordWithToken } from "@/server/accounts/users";

export async function setPasswordAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction({}, async (t) => {
    const input = newPasswordSchema.parse(values);
    await setPasswordWithToken(input.token, input.password, await actionClientKey(), t);
    return { ok: true, message: t("auth.passwordSaved") };
  });
}
