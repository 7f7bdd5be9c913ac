import { getLocale, getTranslations } from "next-intl/server";
import { AuditTable } from "@/components/audit-table";
import { auditRecord, renderAudit } from "@/server/records/audit-record";
import { requirePagePermission } from "@/server/accounts/page-guard";
import { PageHeader } from "@/components/page-header";
import { withClientMessages } from "@/i18n/client-messages";

export async function generateMetadata() {
  return { title: (await getTranslations("home"))("recordsTitle") };
}

async function RecordsPage() {
  await requirePagePermission("audit:read");
  const t = await getTranslations();
  return (
    <div className="space-y-6">
      <PageHeader title={t("home.recordsTitle")} intro={t("home.recordsIntro")} />
      <AuditTable rows={renderAudit(auditRecord(2000), t, await getLocale())} />
      <p className="notice text-sm">{t("caution.records")}</p>
    </div>
  );
}

export default withClientMessages(["audit", "csv", "errors", "table"], RecordsPage);
