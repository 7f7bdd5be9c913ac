import { forbidden } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { importKindsFor } from "@/server/records/csv-import";
import { listFields } from "@/server/ledger/fields";
import { requirePageUser } from "@/server/accounts/page-guard";
import { ImportWorkbench } from "./components";
import { PageHeader } from "@/components/page-header";
import { withClientMessages } from "@/i18n/client-messages";

export async function generateMetadata() {
  return { title: (await getTranslations("csv.import"))("title") };
}

async function ImportPage() {
  const user = await requirePageUser();
  const kinds = importKindsFor(user);
  if (kinds.length === 0) forbidden();
  const t = await getTranslations("csv.import");
  // Growers name fields by id or exact name: show them the ones they may use.
  const fields = kinds.includes("harvests") ? listFields(user) : [];
  return (
    <div className="space-y-8">
      <PageHeader title={t("title")} intro={t("intro")} wide />
      <ImportWorkbench kinds={kinds} />
      {fields.length ? (
        <details className="panel">
          <summary className="cursor-pointer font-semibold">{t("fields")}</summary>
          <table className="mt-3 text-sm">
            <thead className="text-left">
              <tr>
                <th scope="col" className="pr-6">{t("fieldId")}</th>
                <th scope="col" className="pr-6">{t("fieldName")}</th>
                <th scope="col">{t("fieldGrower")}</th>
              </tr>
            </thead>
            <tbody>
              {fields.map((f) => (
                <tr key={f.id}>
                  <td className="pr-6"><code>{f.id}</code></td>
                  <td className="pr-6">{f.name}</td>
                  <td>{f.growerName}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </details>
      ) : null}
    </div>
  );
}

export default withClientMessages(["csv"], ImportPage);
