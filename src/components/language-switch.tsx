import { getLocale, getTranslations } from "next-intl/server";
import { LOCALES } from "@/i18n/locale";
import { initialFormState, type FormState } from "@/lib/form-state";

type LanguageAction = (state: FormState, form: FormData) => Promise<FormState>;

/**
 * 日本語 / English, each written in its own language so a reader who cannot read the current
 * one still finds theirs; the current one is pressed. A plain form: it works before any script
 * loads (a phone on a weak signal). The action comes from app/ (app/(auth)/language/actions.ts).
 */
export async function LanguageSwitch({ action }: { action: LanguageAction }) {
  const locale = await getLocale();
  const t = await getTranslations("nav");
  // Bound to an empty form state: the action's answer is the page rendered again in the new language.
  const submit = action.bind(null, initialFormState) as unknown as (form: FormData) => Promise<void>;
  return (
    <form action={submit} aria-label={t("language")} className="flex items-center gap-1" data-testid="language-switch">
      {LOCALES.map((code) => (
        <button
          key={code}
          type="submit"
          name="locale"
          value={code}
          lang={code}
          aria-pressed={code === locale}
          className="btn-quiet min-h-11 px-3 py-1 text-sm aria-pressed:border-koji aria-pressed:underline"
        >
          {t(`languageNames.${code}`)}
        </button>
      ))}
    </form>
  );
}
