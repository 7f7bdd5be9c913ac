import { getTranslations } from "next-intl/server";
import { listParties } from "@/server/parties";
import { requirePagePermission } from "@/server/page-guard";
import { listUsers } from "@/server/users";
import { InviteForm, UsersTable } from "./components";
import { PageHeader } from "@/components/page-header";

export async function generateMetadata() {
  return { title: (await getTranslations("users"))("title") };
}

export default async function UsersPage() {
  await requirePagePermission("users:manage");
  const t = await getTranslations("users");
  const rows = listUsers().map(({ id, name, email, role, partyName, status }) => ({ id, name, email, role, partyName, status }));
  const parties = listParties().map(({ id, name, kind }) => ({ id, name, kind }));
  return (
    <div className="space-y-8">
      <PageHeader title={t("title")} intro={t("intro")} />
      <UsersTable rows={rows} />
      <section className="panel">
        <h2 className="mb-4 text-xl font-bold">{t("invite")}</h2>
        <InviteForm parties={parties} />
      </section>
    </div>
  );
}
