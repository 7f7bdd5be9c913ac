import { forbidden } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { can } from "@/domain/permissions";
import { listFields } from "@/server/ledger/fields";
import { requirePageUser } from "@/server/accounts/page-guard";
import { listLots } from "@/server/ledger/lots";
import { listParties } from "@/server/ledger/parties";
import { LotsTable } from "@/components/lots-table";
import { readVarietyList } from "@/server/floor/variety-list";
import { HarvestForm } from "./harvest-form";
import { FieldForm, FieldsTable } from "./components";
import { PageHeader } from "@/components/page-header";
import { withClientMessages } from "@/i18n/client-messages";

export async function generateMetadata() {
  return { title: (await getTranslations("home"))("fieldsTitleAll") };
}

async function FieldsPage() {
  const user = await requirePageUser();
  const readsAll = can(user, "fields:read-all");
  if (!readsAll && !can(user, "fields:write-own")) forbidden();
  const t = await getTranslations();
  const rows = listFields(user).map(({ id, name, region, areaHa, growerName }) => ({ id, name, region, areaHa, growerName }));
  const harvestLots = listLots(user, { kind: "harvest", limit: 200 }).items;
  const canWrite = can(user, "fields:write-any") || can(user, "fields:write-own");
  const growers = can(user, "fields:write-any") ? listParties("grower").map(({ id, name }) => ({ id, name })) : null;
  return (
    <div className="space-y-8">
      <PageHeader title={readsAll ? t("home.fieldsTitleAll") : t("home.fieldsTitle")} intro={readsAll ? t("home.fieldsIntroAll") : t("home.fieldsIntro")} />
      <FieldsTable rows={rows} showGrower={readsAll} />
      {can(user, "harvests:record-own") || can(user, "harvests:record-any") ? (
        <section className="panel">
          <h2 className="text-xl font-bold">{t("harvest.title")}</h2>
          <p className="mb-4 text-sm text-ink-soft">{t("harvest.intro")}</p>
          <HarvestForm fields={rows.map(({ id, name, growerName }) => ({ id, name: readsAll ? `${growerName} — ${name}` : name }))} defaultYear={new Date().getFullYear()} varieties={readVarietyList()} />
        </section>
      ) : null}
      <section>
        <h2 className="mb-3 text-xl font-bold">{readsAll ? t("harvest.lots") : t("harvest.myLots")}</h2>
        <LotsTable rows={harvestLots} />
      </section>
      {canWrite ? (
        <section className="panel">
          <h2 className="mb-4 text-xl font-bold">{t("fields.add")}</h2>
          <FieldForm growers={growers} />
        </section>
      ) : null}
    </div>
  );
}

export default withClientMessages(["csv", "errors", "fields", "harvest", "lot", "table", "varietyList"], FieldsPage);
