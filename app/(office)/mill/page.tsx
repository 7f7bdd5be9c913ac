import { getTranslations } from "next-intl/server";
import { can } from "@/domain/permissions";
import { listAwaitingPolishing } from "@/server/lots";
import { requirePagePermission } from "@/server/page-guard";
import { LotsTable } from "@/components/lots-table";

export async function generateMetadata() {
  return { title: (await getTranslations("home"))("millTitle") };
}

export default async function MillPage() {
  const user = await requirePagePermission("polishing:record");
  const t = await getTranslations("home");
  // A miller sees their own mill's queue; the office sees every mill's.
  const rows = listAwaitingPolishing(can(user, "records:read-all") ? null : user.partyId);
  return (
    <div className="space-y-6">
      <header>
        <h1 className="text-3xl font-bold">{t("millTitle")}</h1>
        <p className="text-ink-soft">{t("millIntro")}</p>
      </header>
      <LotsTable rows={rows} />
    </div>
  );
}
