import { redirect } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { BrandMark } from "@/components/brand-mark";
import { FloorLink } from "@/components/floor/floor-link";
import { FloorNav } from "@/components/floor/floor-nav";
import { QueuePanel } from "@/components/floor/queue-panel";
import { UserBar } from "@/components/user-bar";
import { currentUser } from "@/server/accounts/session";
import { setLanguageAction } from "../(auth)/language/actions";
import { signOutAction } from "../(auth)/sign-out/actions";
import { ClientMessages } from "@/i18n/client-messages";

/** Phone first: large type, high contrast, every target at least 48 px for gloved hands. */
export default async function FloorLayout({ children }: { children: React.ReactNode }) {
  const user = await currentUser();
  if (!user) redirect("/sign-in");
  const t = await getTranslations();
  return (
    <ClientMessages namespaces={["floorScan"]}>
    <div className="min-h-dvh bg-ink text-paper">
      <header className="flex items-center justify-between gap-3 border-b-4 border-koji px-4 py-3">
        <FloorLink href="/scan" className="flex min-h-12 items-center gap-2 text-paper no-underline">
          <BrandMark className="h-10 w-10" />
          <span className="font-[family-name:var(--font-display)] text-2xl font-bold">{t("nav.scan")}</span>
        </FloorLink>
        <UserBar user={user} signOut={signOutAction} setLanguage={setLanguageAction} />
      </header>
      <FloorNav actor={user} />
      <QueuePanel userId={user.id} />
      <main id="content" className="mx-auto max-w-xl px-4 py-5 text-lg">
        {children}
      </main>
    </div>
    </ClientMessages>
  );
}
