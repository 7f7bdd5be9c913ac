import { getTranslations } from "next-intl/server";
import { can } from "@/domain/permissions";
import { listParties } from "@/server/ledger/parties";
import { requirePagePermission } from "@/server/accounts/page-guard";
import { PartiesTable, PartyForm } from "./components";
import { PageHeader } from "@/components/page-header";
import { withClientMessages } from "@/i18n/client-messages";

export async function generateMetadata() {
  return { title: (await getTranslations("parties"))("title") };
}

/** The admin manages parties here; the auditor reads the same list with no form on it. */
async function PartiesPage() {
  const user = await requirePagePermission("setup:read");
  const t = await getTranslations("parties");
  const rows = listParties().map(({ id, kind, name, region, email, namedPublicly }) => ({ id, kind, name, region, email, namedPublicly }));
  return (
    <div className="space-y-8">
      <PageHeader title={t("title")} intro={t("intro")} />
      <PartiesTable rows={rows} />
      {can(user, "parties:manage") ? (
        <section className="panel">
          <h2 className="mb-4 text-xl font-bold">{t("new")}</h2>
          <PartyForm />
        </section>
      ) : null}
    </div>
  );
}

export default withClientMessages(["csv", "errors", "parties", "table"], PartiesPage);
