import { forbidden } from "next/navigation";
import { getFormatter, getTranslations } from "next-intl/server";
import { can } from "@/domain/permissions";
import { normaliseLotCode } from "@/domain/lot-code";
import { requirePageUser } from "@/server/accounts/page-guard";
import { listParties } from "@/server/ledger/parties";
import { listRequestsToAnswer } from "@/server/ledger/receipt-requests";
import { PageHeader } from "@/components/page-header";
import { getQuantity } from "@/lib/get-quantity";
import { AnswerRequest, DispatchForm } from "./components";
import { withClientMessages } from "@/i18n/client-messages";

export async function generateMetadata() {
  return { title: (await getTranslations("dispatch"))("title") };
}

async function DispatchPage({ searchParams }: { searchParams: Promise<{ code?: string }> }) {
  const user = await requirePageUser();
  // The shipping step's roles (STEP_RULES.shipping): mill and brewery staff, the office, growers for their harvest.
  if (!can(user, "polishing:record") && !can(user, "brewing:record") && !can(user, "harvests:dispatch-own")) forbidden();
  const t = await getTranslations("dispatch");
  const format = await getFormatter();
  const amount = await getQuantity();
  const code = normaliseLotCode(String((await searchParams).code ?? "")).slice(0, 20);
  // Lots travel to mills and breweries; a party never dispatches to itself, but the office sends for growers to its own brewery.
  const receivers = [...listParties("mill"), ...listParties("brewery")].filter((p) => can(user, "lots:act-any") || p.id !== user.partyId).map(({ id, name }) => ({ id, name }));
  const requests = listRequestsToAnswer(user);
  return (
    <div className="max-w-3xl space-y-6">
      <PageHeader title={t("title")} intro={t("intro")} />
      <section className="panel"><DispatchForm code={code} receivers={receivers} /></section>
      <section className="panel space-y-4" data-testid="receipts-awaiting">
        <h2 className="text-xl font-bold">{t("awaitingTitle")}</h2>
        <p className="text-sm text-ink-soft">{t("awaitingIntro")}</p>
        {requests.length === 0 ? <p>{t("noneAwaiting")}</p> : null}
        <ul className="space-y-4">
          {requests.map((r) => (
            <li key={r.id} className="border-t border-husk pt-3">
              <p>{t("request", { receiver: r.receiver, code: r.code, amount: amount(r.quantity, r.unit ?? "", 3), slip: r.referenceDoc || "—", date: format.dateTime(r.at, "day") })}</p>
              <AnswerRequest id={r.id} />
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}

export default withClientMessages(["dispatch", "floorScan"], DispatchPage);
