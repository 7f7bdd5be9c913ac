import Link from "@/components/app-link";
import { getTranslations } from "next-intl/server";
import { ForgotPasswordForm } from "./components";
import { withClientMessages } from "@/i18n/client-messages";

export async function generateMetadata() {
  return { title: (await getTranslations("auth"))("forgotTitle") };
}

async function ForgotPasswordPage() {
  const t = await getTranslations("auth");
  return (
    <>
      <h1 className="text-2xl font-bold">{t("forgotTitle")}</h1>
      <p className="mt-1 mb-5 text-ink-soft">{t("forgotIntro")}</p>
      <ForgotPasswordForm />
      <p className="mt-5 text-sm">
        <Link href="/sign-in">{t("backToSignIn")}</Link>
      </p>
    </>
  );
}

export default withClientMessages(["auth"], ForgotPasswordPage);
