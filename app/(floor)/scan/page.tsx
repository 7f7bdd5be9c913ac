import { getTranslations } from "next-intl/server";
import { LotCardView } from "@/components/lot-card-view";
import { LotLookupForm } from "@/components/lot-lookup-form";
import { normaliseLotCode } from "@/domain/lot-code";
import { findLot } from "@/server/lots";
import { requirePagePermission } from "@/server/page-guard";

export async function generateMetadata() {
  return { title: (await getTranslations("home"))("scanTitle") };
}

export default async function ScanPage({ searchParams }: { searchParams: Promise<{ code?: string }> }) {
  const user = await requirePagePermission("brewing:record");
  const t = await getTranslations();
  const code = normaliseLotCode((await searchParams).code ?? "");
  const lot = code ? findLot(user, code) : null;
  return (
    <div className="space-y-6">
      <header>
        <h1 className="text-3xl font-bold">{t("home.scanTitle")}</h1>
        <p className="opacity-80">{t("home.scanIntro")}</p>
      </header>
      <LotLookupForm action="/scan" defaultCode={code} large />
      {code && !lot ? <p role="alert" className="notice-warn text-ink">{t("lookup.notFound", { code })}</p> : null}
      {lot ? <LotCardView lot={lot} dark /> : null}
    </div>
  );
}
