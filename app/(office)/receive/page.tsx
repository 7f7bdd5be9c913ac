import { forbidden } from "next/navigation";
import { getFormatter, getTranslations } from "next-intl/server";
import { can } from "@/domain/permissions";
import { requirePageUser } from "@/server/accounts/page-guard";
import { listParties } from "@/server/ledger/parties";
import { listOwnRequests } from "@/server/ledger/receipt-requests";
import { ReceiveForm } from "./components";
import { PageHeader } from "@/components/page-header";
import { withClientMessages } from "@/i18n/client-messages";

export async function generateMetadata() {
  return { title: (await getTranslations("receive"))("title") };
}

async function ReceivePage() {
  const user = await requirePageUser();
  if (!can(user, "polishing:record") && !can(user, "brewing:record")) forbidden();
  const t = await getTranslations("receive");
  const format = await getFormatter();
  // The office records receipts on behalf of the mill or the brewery.
  const receivers = can(user, "lots:act-any") ? [...listParties("brewery"), ...listParties("mill")].map(({ id, name }) => ({ id, name })) : null;
  const requests = listOwnRequests(user);
  return (
    <div className="max-w-3xl space-y-6">
      <PageHeader title={t("title")} intro={t("intro")} />
      <section className="panel"><ReceiveForm receivers={receivers} /></section>
      {requests.length ? (
        <section className="panel" data-testid="own-receipt-requests">
          <h2 className="mb-3 text-xl font-bold">{t("requestsTitle")}</h2>
          <ul className="space-y-2">
            {requests.map((r) => (
              <li key={r.id}>
                {t("requestLine", { code: r.code, quantity: format.number(r.quantity, { maximumFractionDigits: 3 }), slip: r.referenceDoc || "—", date: format.dateTime(r.at, "day") })}{" "}
                <strong>{t(`states.${r.outcome}`)}</strong>
                {r.reason ? ` — ${r.reason}` : ""}
              </li>
            ))}
          </ul>
        </section>
      ) : null}
    </div>
  );
}

export default withClientMessages(["floorScan", "receive"], ReceivePage);
