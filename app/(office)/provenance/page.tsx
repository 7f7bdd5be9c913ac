import { getTranslations } from "next-intl/server";
import { LotCardView } from "@/components/lot-card-view";
import { LotLookupForm } from "@/components/lot-lookup-form";
import { normaliseLotCode } from "@/domain/lot-code";
import { findLot } from "@/server/lots";
import { requirePagePermission } from "@/server/page-guard";

export async function generateMetadata() {
  return { title: (await getTranslations("home"))("provenanceTitle") };
}

export default async function ProvenancePage({ searchParams }: { searchParams: Promise<{ code?: string }> }) {
  const user = await requirePagePermission("provenance:read");
  const t = await getTranslations();
  const code = normaliseLotCode((await searchParams).code ?? "");
  const lot = code ? findLot(user, code) : null;
  return (
    <div className="max-w-2xl space-y-6">
      <header>
        <h1 className="text-3xl font-bold">{t("home.provenanceTitle")}</h1>
        <p className="text-ink-soft">{t("home.provenanceIntro")}</p>
      </header>
      <LotLookupForm action="/provenance" defaultCode={code} />
      {code && !lot ? <p role="alert" className="notice-warn">{t("lookup.notFound", { code })}</p> : null}
      {lot ? <LotCardView lot={lot} /> : null}
      <p className="notice text-sm">{t("caution.records")}</p>
    </div>
  );
}
