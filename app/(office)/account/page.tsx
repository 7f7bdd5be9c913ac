import { forbidden } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { AccountTable, BalancePanel, StatementsTable } from "@/components/supplier-account";
import { DeliveriesTable, ReceiptsTable, RunsTable } from "@/components/supplier-activity";
import { can } from "@/domain/permissions";
import { actionTranslator } from "@/server/action";
import { requirePageUser } from "@/server/page-guard";
import { getParty } from "@/server/parties";
import { accountRows } from "@/server/supplier-describe";
import { growerPortal, millPortal } from "@/server/supplier-portal";
import { HarvestTrails, MyFields } from "./components";

export async function generateMetadata() {
  return { title: (await getTranslations("nav"))("account") };
}

/** A supplier's own pages: the grower's rice and money, or the mill's runs and fees. Only their own party. */
export default async function AccountPage() {
  const user = await requirePageUser();
  if (!can(user, "ledger:read-own")) forbidden();
  const kind = getParty(user.partyId)?.kind;
  if (kind === "grower") return <GrowerAccount />;
  if (kind === "mill") return <MillAccount />;
  forbidden();
}

async function GrowerAccount() {
  const user = await requirePageUser();
  const p = growerPortal(user);
  const t = await getTranslations("suppliers");
  const rows = accountRows(p.ledger, await actionTranslator());
  return (
    <div className="space-y-8">
      <header>
        <h1 className="text-3xl font-bold">{t("portal.growerTitle")}</h1>
        <p className="max-w-3xl text-ink-soft">{t("portal.growerIntro")}</p>
      </header>
      <BalancePanel title={t("portal.owed")} balanceYen={p.ledger.balanceYen} ageing={p.ledger.ageing} note={t("portal.owedNote")} />
      <section className="space-y-3">
        <h2 className="text-xl font-bold">{t("portal.harvests")}</h2>
        <p className="text-sm text-ink-soft">{t("portal.harvestsIntro")}</p>
        <HarvestTrails rows={p.harvests} />
      </section>
      <section className="space-y-3">
        <h2 className="text-xl font-bold">{t("portal.deliveries")}</h2>
        <DeliveriesTable rows={p.deliveries} />
      </section>
      <section className="space-y-3">
        <h2 className="text-xl font-bold">{t("portal.payments")}</h2>
        <AccountTable rows={rows.filter((r) => r.kind === "payment")} testId="payments-table" exportName="grainline-payments" />
      </section>
      <section className="space-y-3">
        <h2 className="text-xl font-bold">{t("detail.entries")}</h2>
        <AccountTable rows={rows} />
      </section>
      <section className="space-y-3">
        <h2 className="text-xl font-bold">{t("portal.statements")}</h2>
        <StatementsTable partyId={p.party.id} rows={p.statements.map(({ totals: _t, ...s }) => s)} />
      </section>
      <section className="space-y-3">
        <h2 className="text-xl font-bold">{t("portal.fields")}</h2>
        <MyFields rows={p.fields} />
      </section>
    </div>
  );
}

async function MillAccount() {
  const user = await requirePageUser();
  const p = millPortal(user);
  const t = await getTranslations("suppliers");
  const rows = accountRows(p.ledger, await actionTranslator());
  return (
    <div className="space-y-8">
      <header>
        <h1 className="text-3xl font-bold">{t("portal.millTitle")}</h1>
        <p className="max-w-3xl text-ink-soft">{t("portal.millIntro")}</p>
      </header>
      <BalancePanel title={t("portal.owed")} balanceYen={p.ledger.balanceYen} ageing={p.ledger.ageing} note={t("portal.owedNote")} />
      <section className="space-y-3">
        <h2 className="text-xl font-bold">{t("detail.receipts")}</h2>
        <ReceiptsTable rows={p.receipts} />
      </section>
      <section className="space-y-3">
        <h2 className="text-xl font-bold">{t("detail.runs")}</h2>
        <RunsTable rows={p.runs} />
      </section>
      <section className="space-y-3">
        <h2 className="text-xl font-bold">{t("portal.fees")}</h2>
        <AccountTable rows={rows.filter((r) => r.kind === "polishing-fee" || r.kind === "reversal")} testId="fees-table" exportName="grainline-fees" />
      </section>
      <section className="space-y-3">
        <h2 className="text-xl font-bold">{t("portal.payments")}</h2>
        <AccountTable rows={rows.filter((r) => r.kind === "payment")} testId="payments-table" exportName="grainline-payments" />
      </section>
      <section className="space-y-3">
        <h2 className="text-xl font-bold">{t("detail.entries")}</h2>
        <AccountTable rows={rows} />
      </section>
      <section className="space-y-3">
        <h2 className="text-xl font-bold">{t("portal.statements")}</h2>
        <StatementsTable partyId={p.party.id} rows={p.statements.map(({ totals: _t, ...s }) => s)} />
      </section>
    </div>
  );
}
