import Link from "@/components/app-link";
import { redirect } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { HOME_FOR_ROLE } from "@/domain/permissions";
import { safeNextPath } from "@/domain/safe-next";
import { currentUser } from "@/server/accounts/session";
import { LanguageSwitch } from "@/components/language-switch";
import { setLanguageAction } from "../language/actions";
import { SignInForm } from "./components";
import { withClientMessages } from "@/i18n/client-messages";

export async function generateMetadata() {
  const t = await getTranslations("auth");
  return { title: t("signInTitle") };
}

async function SignInPage({ searchParams }: { searchParams: Promise<{ next?: string | string[] }> }) {
  // Only a path on this site is kept (an absolute or //host address is ignored: no open redirect).
  const next = safeNextPath((await searchParams).next) ?? undefined;
  const user = await currentUser();
  if (user && next) redirect(next);
  if (user) redirect(HOME_FOR_ROLE[user.role]);
  const t = await getTranslations("auth");
  return (
    <>
      <h1 className="text-2xl font-bold">{t("signInTitle")}</h1>
      <p className="mt-1 mb-5 text-ink-soft">{t("signInIntro")}</p>
      <SignInForm next={next} />
      <p className="mt-5 text-sm">
        <Link href="/forgot-password">{t("forgot")}</Link>
      </p>
      <div className="mt-5 flex justify-end">
        <LanguageSwitch action={setLanguageAction} />
      </div>
    </>
  );
}

export default withClientMessages(["auth"], SignInPage);
