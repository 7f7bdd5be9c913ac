import { forbidden } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { can } from "@/domain/permissions";
import { requirePageUser } from "@/server/page-guard";
import { listParties } from "@/server/parties";
import { ReceiveForm } from "./components";

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
      <header>
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        <p className="text-ink-soft">{t("intro")}</p>
      </header>
      <section className="panel"><ReceiveForm receivers={receivers} /></section>
    </div>
  );
}
