"use server";

import { cookies } from "next/headers";
import { redirect } from "next/navigation";
import { HOME_FOR_ROLE } from "@/domain/permissions";
import { safeNextPath } from "@/domain/safe-next";
import { formValues, type FormState } from "@/lib/form-state";
import { signInSchema } from "@/lib/validation/auth";
import { actionClientKey, guardAction } from "@/server/platform/action";
import { lucia } from "@/server/accounts/auth";
import { AppError } from "@/server/platform/errors";
import { rememberLocale } from "@/server/accounts/locale-cookie";
import { requestIsHttps } from "@/server/accounts/session";
import { signIn } from "@/server/accounts/users";

export async function signInAction(_prev: FormState, formData: FormData): Promise<FormState> {
  // The destination rides beside the credentials, never inside the schema's input.
  const { next, ...values } = formValues(formData);
  let home = "/";
  const state = await guardAction({ email: values.email ?? "" }, async (t) => {
    const input = signInSchema.parse(values);
    try {
      const { user, sessionToken, locale } = await signIn(input.email, input.password, await actionClientKey());
      const cookie = lucia().createSessionCookie(sessionToken);
      (await cookies()).set(cookie.name, cookie.value, { ...cookie.attributes, secure: await requestIsHttps() });
      // The phone's API calls carry no session read for the language: the cookie tells them.
      if (locale) await rememberLocale(locale);
      // Back where a link (a label's QR code) was going, if it is a path on this site; else home.
      home = safeNextPath(next) ?? HOME_FOR_ROLE[user.role];
    } catch (error) {
      if (error instanceof AppError && error.code === "unauthenticated") return { message: t("auth.wrongCredentials"), values: { email: input.email } };
      if (error instanceof AppError && error.code === "rate_limited") return { message: t("auth.throttled", error.values), values: { email: input.email } };
      throw error;
    }
  });
  if (state.ok) redirect(home);
  return state;
}
