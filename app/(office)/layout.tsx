import Link from "@/components/app-link";
import { redirect } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { BrandMark } from "@/components/brand-mark";
import { navFor } from "@/components/nav-items";
import { SearchBox } from "@/components/search-box";
import { UserBar } from "@/components/user-bar";
import { currentUser } from "@/server/accounts/session";
import { setLanguageAction } from "../(auth)/language/actions";
import { signOutAction } from "../(auth)/sign-out/actions";
import { ClientMessages } from "@/i18n/client-messages";

export default async function OfficeLayout({ children }: { children: React.ReactNode }) {
  const user = await currentUser();
  if (!user) redirect("/sign-in");
  const t = await getTranslations();
  return (
    <ClientMessages namespaces={[]}>
    <div className="min-h-dvh">
      <header className="border-b-4 border-koji bg-cedar-deep text-paper print:hidden">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-2">
          <Link href="/" className="flex items-center gap-2 text-paper no-underline">
            <BrandMark className="h-8 w-8" />
            <span className="font-[family-name:var(--font-display)] text-xl font-bold">{t("app.name")}</span>
          </Link>
          <nav aria-label={t("nav.office")} className="flex flex-1 flex-wrap gap-1">
            {navFor(user).map((item) => (
              <Link key={item.href} href={item.href} className="rounded px-3 py-2 text-sm font-semibold text-paper hover:bg-cedar">
                {t(`nav.${item.label}`)}
              </Link>
            ))}
          </nav>
          <SearchBox />
          <UserBar user={user} signOut={signOutAction} setLanguage={setLanguageAction} />
        </div>
      </header>
      <main id="content" className="mx-auto max-w-7xl px-4 py-6 print:m-0 print:max-w-none print:p-0">
        {children}
      </main>
    </div>
    </ClientMessages>
  );
}
