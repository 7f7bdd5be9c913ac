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
      <Section title={t("portal.harvests")}>
        <p className="text-sm text-ink-soft">{t("portal.harvestsIntro")}</p>
        <HarvestTrails rows={p.harvests} />
      </Section>
      <Section title={t("portal.deliveries")}>
        <DeliveriesTable rows={p.deliveries} />
      </Section>
      <Section title={t("portal.payments")}>
        <AccountTable rows={rows.filter((r) => r.kind === "payment")} testId="payments-table" exportName="grainline-payments" />
      </Section>
      <Section title={t("detail.entries")}>
        <AccountTable rows={rows} />
      </Section>
      <Section title={t("portal.statements")}>
        <StatementsTable partyId={p.party.id} rows={p.statements.map(({ totals: _t, ...s }) => s)} />
      </Section>
      <Section title={t("portal.fields")}>
        <MyFields rows={p.fields} />
      </Section>
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
      <Section title={t("detail.receipts")}>
        <ReceiptsTable rows={p.receipts} />
      </Section>
      <Section title={t("detail.runs")}>
        <RunsTable rows={p.runs} />
      </Section>
      <Section title={t("portal.fees")}>
        <AccountTable rows={rows.filter((r) => r.kind === "polishing-fee" || r.kind === "reversal")} testId="fees-table" exportName="grainline-fees" />
      </Section>
      <Section title={t("portal.payments")}>
        <AccountTable rows={rows.filter((r) => r.kind === "payment")} testId="payments-table" exportName="grainline-payments" />
      </Section>
      <Section title={t("detail.entries")}>
        <AccountTable rows={rows} />
      </Section>
      <Section title={t("portal.statements")}>
        <StatementsTable partyId={p.party.id} rows={p.statements.map(({ totals: _t, ...s }) => s)} />
      </Section>
    </div>
  );
}

/** One titled block of an account page. */
function Section({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <section className="space-y-3">
      <h2 className="text-xl font-bold">{title}</h2>
      {children}
    </section>
  );
}
