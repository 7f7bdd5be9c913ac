import { getTranslations } from "next-intl/server";
import type { SessionUser } from "@/server/session";

/** Who is signed in, and the way out; the sign-out action is passed in from app/. */
export async function UserBar({ user, signOut }: { user: SessionUser; signOut: () => Promise<void> }) {
  const t = await getTranslations();
  return (
    <div className="flex items-center gap-3 text-sm">
      <span data-testid="signed-in-as">{t("nav.signedInAs", { name: user.name, role: t(`roles.${user.role}`) })}</span>
      <form action={signOut}>
        <button type="submit" className="btn-quiet min-h-11 px-3 py-1">
          {t("nav.signOut")}
        </button>
      </form>
    </div>
  );
}
