import { getTranslations } from "next-intl/server";
import { AuditTable } from "@/components/audit-table";
import { listAudit } from "@/server/audit";
import { requirePagePermission } from "@/server/page-guard";

export async function generateMetadata() {
  return { title: (await getTranslations("home"))("recordsTitle") };
}

export default async function RecordsPage() {
  await requirePagePermission("audit:read");
  const t = await getTranslations();
  return (
    <div className="space-y-6">
      <header>
        <h1 className="text-3xl font-bold">{t("home.recordsTitle")}</h1>
        <p className="text-ink-soft">{t("home.recordsIntro")}</p>
      </header>
      <AuditTable rows={listAudit(2000)} />
      <p className="notice text-sm">{t("caution.records")}</p>
    </div>
  );
}
