import Link from "@/components/app-link";
import { getTranslations } from "next-intl/server";
import { findLinkHolder } from "@/server/accounts/users";
import { SetPasswordForm } from "./components";
import { withClientMessages } from "@/i18n/client-messages";

export async function generateMetadata() {
  return { title: (await getTranslations("auth"))("setTitle") };
}

async function SetPasswordPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const t = await getTranslations("auth");
  const holder = findLinkHolder(token);
  return (
    <>
      <h1 className="text-2xl font-bold">{t("setTitle")}</h1>
      {holder ? (
        <>
          <p className="mt-1 mb-5 text-ink-soft">{t("setIntro", { name: holder.name, email: holder.email })}</p>
          <SetPasswordForm token={token} email={holder.email} />
        </>
      ) : (
        <p className="notice-warn mt-4">{t("linkInvalid")}</p>
      )}
      <p className="mt-5 text-sm">
        <Link href="/sign-in">{t("backToSignIn")}</Link>
      </p>
    </>
  );
}

export default withClientMessages(["auth"], SetPasswordPage);
