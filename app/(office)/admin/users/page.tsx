import { getTranslations } from "next-intl/server";
import { can } from "@/domain/permissions";
import { listParties } from "@/server/ledger/parties";
import { requirePagePermission } from "@/server/accounts/page-guard";
import { listUsers } from "@/server/accounts/users";
import { InviteForm, UsersTable } from "./components";
import { PageHeader } from "@/components/page-header";
import { withClientMessages } from "@/i18n/client-messages";

export async function generateMetadata() {
  return { title: (await getTranslations("users"))("title") };
}

/** The admin manages users here; the auditor reads the same table with no form on it. */
async function UsersPage() {
  const user = await requirePagePermission("setup:read");
  const manage = can(user, "users:manage");
  const t = await getTranslations("users");
  const rows = listUsers().map(({ id, name, email, role, partyName, partyKind, status }) => ({ id, name, email, role, partyName, partyKind, status }));
  const parties = listParties().map(({ id, name, kind }) => ({ id, name, kind }));
  return (
    <div className="space-y-8">
      <PageHeader title={t("title")} intro={t("intro")} />
      {manage ? null : <p className="notice text-sm">{t("readOnly")}</p>}
      <UsersTable rows={rows} manage={manage} />
      {manage ? (
        <section className="panel">
          <h2 className="mb-4 text-xl font-bold">{t("invite")}</h2>
          <InviteForm parties={parties} />
        </section>
      ) : null}
    </div>
  );
}

export default withClientMessages(["csv", "errors", "parties", "roles", "table", "users"], UsersPage);
