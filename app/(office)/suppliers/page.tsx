import { forbidden } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { can } from "@/domain/permissions";
import { requirePageUser } from "@/server/accounts/page-guard";
import { listSupplierBalances } from "@/server/suppliers/supplier-ledger";
import { readTaxRounding } from "@/server/suppliers/supplier-settings";
import { RoundingForm, SuppliersTable } from "./components";
import { PageHeader } from "@/components/page-header";
import { withClientMessages } from "@/i18n/client-messages";

export async function generateMetadata() {
  return { title: (await getTranslations("suppliers"))("title") };
}

async function SuppliersPage() {
  const user = await requirePageUser();
  if (!can(user, "ledger:read-all")) forbidden();
  const t = await getTranslations("suppliers");
  const rows = listSupplierBalances(user).map(({ id, name, kind, invoiceNumber, balanceYen, ageing }) => ({ id, name, kind, invoiceNumber, balanceYen, ageing }));
  return (
    <div className="space-y-8">
      <PageHeader title={t("title")} intro={t("intro")} wide />
      <SuppliersTable rows={rows} />
      <section className="panel max-w-3xl space-y-3">
        <h2 className="text-xl font-bold">{t("rounding.title")}</h2>
        <p className="text-sm text-ink-soft">{t("rounding.intro")}</p>
        {can(user, "ledger:manage") ? <RoundingForm current={readTaxRounding()} /> : <p>{t(`rounding.${readTaxRounding()}`)}</p>}
      </section>
    </div>
  );
}

export default withClientMessages(["csv", "errors", "suppliers", "table"], SuppliersPage);
