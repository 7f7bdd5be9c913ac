import { getTranslations } from "next-intl/server";
import { BrandMark } from "@/components/brand-mark";
import { ClientMessages } from "@/i18n/client-messages";

export default async function AuthLayout({ children }: { children: React.ReactNode }) {
  const t = await getTranslations("app");
  return (
    <main className="mx-auto flex min-h-dvh max-w-md flex-col justify-center px-5 py-10">
      <div className="mb-8 flex items-center gap-3">
        <BrandMark className="h-12 w-12" />
        <div>
          <p className="font-[family-name:var(--font-display)] text-3xl font-bold text-cedar-deep">{t("name")}</p>
          <p className="text-sm text-ink-soft">{t("tagline")}</p>
        </div>
      </div>
      <div className="panel">
        <ClientMessages namespaces={[]}>{children}</ClientMessages>
      </div>
    </main>
  );
}
