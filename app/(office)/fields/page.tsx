import { forbidden } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { can } from "@/domain/permissions";
import { listFields } from "@/server/fields";
import { requirePageUser } from "@/server/page-guard";
import { listParties } from "@/server/parties";
import { FieldForm, FieldsTable } from "./components";

export async function generateMetadata() {
  return { title: (await getTranslations("home"))("fieldsTitleAll") };
}

export default async function FieldsPage() {
  const user = await requirePageUser();
  const readsAll = can(user, "fields:read-all");
  if (!readsAll && !can(user, "fields:write-own")) forbidden();
  const t = await getTranslations();
  const rows = listFields(user).map(({ id, name, region, areaHa, growerName }) => ({ id, name, region, areaHa, growerName }));
  const canWrite = can(user, "fields:write-any") || can(user, "fields:write-own");
  const growers = can(user, "fields:write-any") ? listParties("grower").map(({ id, name }) => ({ id, name })) : null;
  return (
    <div className="space-y-8">
      <header>
        <h1 className="text-3xl font-bold">{readsAll ? t("home.fieldsTitleAll") : t("home.fieldsTitle")}</h1>
        <p className="text-ink-soft">{readsAll ? t("home.fieldsIntroAll") : t("home.fieldsIntro")}</p>
      </header>
      <FieldsTable rows={rows} showGrower={readsAll} />
      {canWrite ? (
        <section className="panel">
          <h2 className="mb-4 text-xl font-bold">{t("fields.add")}</h2>
          <FieldForm growers={growers} />
        </section>
      ) : null}
    </div>
  );
}
