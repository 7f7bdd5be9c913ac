import Link from "@/components/app-link";
import { getTranslations } from "next-intl/server";
import { LotCardView } from "@/components/lot-card-view";
import { LotLookupForm } from "@/components/lot-lookup-form";
import { ProvenanceCard } from "@/components/provenance-card";
import { normaliseLotCode } from "@/domain/lot-code";
import { findLot } from "@/server/ledger/lots";
import { requirePagePermission } from "@/server/accounts/page-guard";
import { provenanceFor } from "@/server/trace/provenance";
import { PageHeader } from "@/components/page-header";
import { withClientMessages } from "@/i18n/client-messages";

export async function generateMetadata() {
  return { title: (await getTranslations("home"))("provenanceTitle") };
}

async function ProvenancePage({ searchParams }: { searchParams: Promise<{ code?: string }> }) {
  const user = await requirePagePermission("provenance:read");
  const t = await getTranslations();
  const code = normaliseLotCode((await searchParams).code ?? "");
  const lot = code ? findLot(user, code) : null;
  const answer = lot ? provenanceFor(user, code) : null;
  return (
    <div className="max-w-3xl space-y-6">
      <PageHeader title={t("home.provenanceTitle")} intro={t("home.provenanceIntro")} />
      <LotLookupForm action="/provenance" defaultCode={code} />
      {code && !lot ? <p role="alert" className="notice-warn">{t("lookup.notFound", { code })}</p> : null}
      {lot && answer ? (
        <>
          <LotCardView lot={lot} />
          <ProvenanceCard p={answer} caution />
          <p className="flex flex-wrap gap-3">
            <a className="btn" href={`/api/provenance/${lot.code}/sheet.pdf`}>{t("provenance.sheet")}</a>
            <Link className="btn-quiet" href={`/lots/${lot.code}/graph`}>{t("provenance.graph")}</Link>
            <Link className="btn-quiet" href={`/recall?code=${lot.code}`}>{t("provenance.recall")}</Link>
          </p>
        </>
      ) : null}
      <p className="notice text-sm">{t("caution.records")}</p>
    </div>
  );
}

export default withClientMessages(["floorScan"], ProvenancePage);
