import { getTranslations } from "next-intl/server";
import { PageHeader } from "@/components/page-header";
import { requirePagePermission } from "@/server/accounts/page-guard";
import { listProducts } from "@/server/ledger/products";
import { ProductForm, ProductsTable } from "./components";
import { withClientMessages } from "@/i18n/client-messages";

export async function generateMetadata() {
  return { title: (await getTranslations("products"))("title") };
}

/** The product register: what a bottling may name, with the category its label claims. */
async function ProductsPage() {
  await requirePagePermission("settings:manage");
  const t = await getTranslations("products");
  return (
    <div className="space-y-8">
      <PageHeader title={t("title")} intro={t("intro")} />
      <ProductsTable rows={listProducts()} />
      <section className="panel max-w-2xl">
        <h2 className="mb-4 text-xl font-bold">{t("new")}</h2>
        <ProductForm />
      </section>
      <p className="notice text-sm">{t("claimNote")}</p>
    </div>
  );
}

export default withClientMessages(["csv", "errors", "products", "table"], ProductsPage);
