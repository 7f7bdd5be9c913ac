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

/** The account page's form: the same setting, plus going back to the browser's language (""). */
export async function LanguageSetting({ action, current }: { action: LanguageAction; current: string | null | undefined }) {
  const t = await getTranslations("nav");
  const submit = action.bind(null, initialFormState) as unknown as (form: FormData) => Promise<void>;
  return (
    <form action={submit} className="flex flex-wrap items-end gap-3" data-testid="language-setting">
      <label className="block">
        <span className="field-label">{t("language")}</span>
        {/* Keyed by the stored value: after saving, the form shows what is stored, not what React kept. */}
        <select key={current ?? ""} name="locale" defaultValue={current ?? ""} className="field-input">
          <option value="">{t("languageFollowBrowser")}</option>
          {LOCALES.map((code) => (
            <option key={code} value={code} lang={code}>
              {t(`languageNames.${code}`)}
            </option>
          ))}
        </select>
      </label>
      <button type="submit" className="btn">{t("languageSave")}</button>
      <p className="w-full text-sm text-ink-soft">{t("languageHint")}</p>
    </form>
  );
}
