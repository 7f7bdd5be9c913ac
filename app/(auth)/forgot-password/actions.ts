"use server";

import { formValues, type FormState } from "@/lib/form-state";
import { forgotPasswordSchema } from "@/lib/validation/auth";
import { actionClientKey, actionOrigin, guardAction } from "@/server/action";
import { AppError } from "@/server/errors";
import { isThrottled, recordFailure } from "@/server/throttle";
import { requestPasswordReset } from "@/server/users";

export async function forgotPasswordAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const { email } = forgotPasswordSchema.parse(values);
    const client = await actionClientKey();
    // Each request counts against the same budget as failed sign-ins, so the form
    // cannot be used to flood someone's mailbox.
    if (isThrottled(email, client)) throw new AppError("rate_limited", "errors.tooManyRequests");
    recordFailure(email, client);
    await requestPasswordReset(email, await actionOrigin(), t);
    return { ok: true, message: t("auth.linkSent") };
  });
}
