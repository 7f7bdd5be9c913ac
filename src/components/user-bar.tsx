import { getTranslations } from "next-intl/server";
import type { FormState } from "@/lib/form-state";
import type { SessionUser } from "@/server/accounts/session";
import { LanguageSwitch } from "./language-switch";

type Props = {
  user: SessionUser;
  signOut: () => Promise<void>;
  /** The language switch's action (app/(auth)/language/actions.ts); without it no switch is shown. */
  setLanguage?: (state: FormState, form: FormData) => Promise<FormState>;
};

/** Who is signed in, their language, and the way out; the actions are passed in from app/. */
export async function UserBar({ user, signOut, setLanguage }: Props) {
  const t = await getTranslations();
  return (
    <div className="flex flex-wrap items-center gap-3 text-sm">
      <span data-testid="signed-in-as">{t("nav.signedInAs", { name: user.name, role: t(`roles.${user.role}`) })}</span>
      {setLanguage ? <LanguageSwitch action={setLanguage} /> : null}
      <form action={signOut}>
        <button type="submit" className="btn-quiet min-h-11 px-3 py-1">
          {t("nav.signOut")}
        </button>
      </form>
    </div>
  );
}
