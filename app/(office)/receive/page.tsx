import { forbidden } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { can } from "@/domain/permissions";
import { requirePageUser } from "@/server/page-guard";
import { listParties } from "@/server/parties";
import { ReceiveForm } from "./components";
import { PageHeader } from "@/components/page-header";

export async function generateMetadata() {
  return { title: (await getTranslations("receive"))("title") };
}

export default async function ReceivePage() {
  const user = await requirePageUser();
  if (!can(user, "polishing:record") && !can(user, "brewing:record")) forbidden();
  const t = await getTranslations("receive");
  // The office records receipts on behalf of the mill or the brewery.
  const receivers = can(user, "lots:act-any") ? [...listParties("brewery"), ...listParties("mill")].map(({ id, name }) => ({ id, name })) : null;
  return (
    <div className="max-w-3xl space-y-6">
      <PageHeader title={t("title")} intro={t("intro")} />
      <section className="panel"><ReceiveForm receivers={receivers} /></section>
    </div>
  );
}
