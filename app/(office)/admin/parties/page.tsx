import { getTranslations } from "next-intl/server";
import { listParties } from "@/server/parties";
import { requirePagePermission } from "@/server/page-guard";
import { PartiesTable, PartyForm } from "./components";
import { PageHeader } from "@/components/page-header";

export async function generateMetadata() {
  return { title: (await getTranslations("parties"))("title") };
}

export default async function PartiesPage() {
  await requirePagePermission("parties:manage");
  const t = await getTranslations("parties");
  const rows = listParties().map(({ id, kind, name, region, email, namedPublicly }) => ({ id, kind, name, region, email, namedPublicly }));
  return (
    <div className="space-y-8">
      <PageHeader title={t("title")} intro={t("intro")} />
      <PartiesTable rows={rows} />
      <section className="panel">
        <h2 className="mb-4 text-xl font-bold">{t("new")}</h2>
        <PartyForm />
      </section>
    </div>
  );
}
