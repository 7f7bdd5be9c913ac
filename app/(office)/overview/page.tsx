import { getLocale, getTranslations } from "next-intl/server";
import { AuditTable } from "@/components/audit-table";
import { auditRecord, renderAudit } from "@/server/records/audit-record";
import { overviewCounts } from "@/server/platform/overview";
import { requirePagePermission } from "@/server/accounts/page-guard";
import { PageHeader } from "@/components/page-header";
import { withClientMessages } from "@/i18n/client-messages";

export async function generateMetadata() {
  return { title: (await getTranslations("home"))("overviewTitle") };
}

async function OverviewPage() {
  await requirePagePermission("users:manage");
  const t = await getTranslations("home");
  const all = await getTranslations();
  const counts = overviewCounts();
  return (
    <div className="space-y-8">
      <PageHeader title={t("overviewTitle")} intro={t("overviewIntro")} />
      <dl className="grid grid-cols-2 gap-4 sm:grid-cols-5">
        {(Object.keys(counts) as (keyof typeof counts)[]).map((key) => (
          <div key={key} className="panel">
            <dt className="text-sm font-semibold text-ink-soft">{t(`counts.${key}`)}</dt>
            <dd className="font-[family-name:var(--font-display)] text-4xl font-bold text-cedar-deep" data-testid={`count-${key}`}>{counts[key]}</dd>
          </div>
        ))}
      </dl>
      <section>
        <h2 className="mb-3 text-xl font-bold">{t("recentActivity")}</h2>
        <AuditTable rows={renderAudit(auditRecord(50), all, await getLocale())} pageSize={10} />
      </section>
    </div>
  );
}

export default withClientMessages(["audit", "csv", "errors", "table"], OverviewPage);
