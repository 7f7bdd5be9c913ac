"use server";

import { formValues, type FormState } from "@/lib/form-state";
import { languageSchema } from "@/lib/validation/language";
import { guardAction } from "@/server/platform/action";
import { forgetLocale, rememberLocale } from "@/server/accounts/locale-cookie";
import { currentUser } from "@/server/accounts/session";
import { setOwnLocale } from "@/server/accounts/users";

/**
 * The language switch. Open to anyone: a visitor's choice lives in the cookie only; a signed-in
 * person's is also stored as their own setting (never anyone else's). Setting the cookie makes
 * Next render the page again in the new language.
 */
export async function setLanguageAction(_prev: FormState, formData: FormData): Promise<FormState> {
  return guardAction({}, async () => {
    const user = await currentUser();
    const { locale } = languageSchema.parse(formValues(formData));
    if (user) setOwnLocale(user, locale || null);
    if (locale) await rememberLocale(locale);
    else await forgetLocale();
  });
}
