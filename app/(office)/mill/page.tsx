import { getTranslations } from "next-intl/server";
import { can } from "@/domain/permissions";
import { listAwaitingPolishing } from "@/server/ledger/lots";
import { requirePagePermission } from "@/server/accounts/page-guard";
import { LotsTable } from "@/components/lots-table";
import { PolishingRunForm } from "./components";
import { PageHeader } from "@/components/page-header";
import { withClientMessages } from "@/i18n/client-messages";

export async function generateMetadata() {
  return { title: (await getTranslations("home"))("millTitle") };
}

async function MillPage() {
  const user = await requirePagePermission("polishing:record");
  const t = await getTranslations();
  // A miller sees their own mill's queue; the office sees every mill's.
  const rows = listAwaitingPolishing(can(user, "records:read-all") ? null : user.partyId);
  return (
    <div className="space-y-8">
      <PageHeader title={t("home.millTitle")} intro={t("home.millIntro")} />
      <LotsTable rows={rows} />
      <section className="panel max-w-4xl">
        <h2 className="text-xl font-bold">{t("polishing.title")}</h2>
        <p className="mb-4 text-sm text-ink-soft">{t("polishing.intro")}</p>
        <PolishingRunForm />
      </section>
    </div>
  );
}

export default withClientMessages(["csv", "errors", "floorScan", "lot", "polishing", "table", "varietyList"], MillPage);
