import { forbidden } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { AccountTable, BalancePanel, StatementsTable } from "@/components/supplier-account";
import { DeliveriesTable, ReceiptsTable } from "@/components/supplier-activity";
import { can } from "@/domain/permissions";
import { actionTranslator } from "@/server/platform/action";
import { requirePageUser } from "@/server/accounts/page-guard";
import { getParty } from "@/server/ledger/parties";
import { accountRows, type AccountRow } from "@/server/suppliers/supplier-describe";
import { growerPortal, millPortal } from "@/server/suppliers/supplier-portal";
import { HarvestTrails, MyFields } from "./components";
import { PageHeader } from "@/components/page-header";
import { LanguageSetting } from "@/components/language-switch";
import { setLanguageAction } from "../../(auth)/language/actions";
import { RunsPagedTable } from "@/components/supplier-lists/runs-table";
import { withClientMessages } from "@/i18n/client-messages";

type Search = { page?: string | string[]; unpriced?: string | string[] };
const first = (value: string | string[] | undefined) => (Array.isArray(value) ? value[0] : value);

export async function generateMetadata() {
  return { title: (await getTranslations("nav"))("account") };
}

/** A supplier's own pages: the grower's rice and money, or the mill's runs and fees. Only their own party. */
async function AccountPage({ searchParams }: { searchParams: Promise<Search> }) {
  const user = await requirePageUser();
  if (!can(user, "ledger:read-own")) forbidden();
  const kind = getParty(user.partyId)?.kind;
  if (kind === "grower") return <GrowerAccount />;
  if (kind === "mill") return <MillAccount search={await searchParams} />;
  forbidden();
}

async function GrowerAccount() {
  const p = growerPortal(await requirePageUser());
  const t = await getTranslations("suppliers");
  const rows = accountRows(p.ledger, await actionTranslator());
  return (
    <AccountFrame portal={p} rows={rows} title={t("portal.growerTitle")} intro={t("portal.growerIntro")} after={<Section title={t("portal.fields")}><MyFields rows={p.fields} /></Section>}>
      <Section title={t("portal.harvests")}>
        <p className="text-sm text-ink-soft">{t("portal.harvestsIntro")}</p>
        <HarvestTrails rows={p.harvests} />
      </Section>
      <Section title={t("portal.deliveries")}>
        <DeliveriesTable rows={p.deliveries} />
      </Section>
    </AccountFrame>
  );
}

async function MillAccount({ search }: { search: Search }) {
  const p = millPortal(await requirePageUser());
  // The mill's runs a page at a time, as the office's account of the mill lists them; the address is this page's own.
  const view = { partyId: p.party.id, page: Number(first(search.page)) || 1, unpricedOnly: first(search.unpriced) === "1", at: "/account" };
  const t = await getTranslations("suppliers");
  const rows = accountRows(p.ledger, await actionTranslator());
  return (
    <AccountFrame portal={p} rows={rows} title={t("portal.millTitle")} intro={t("portal.millIntro")}>
      <Section title={t("detail.receipts")}>
        <ReceiptsTable rows={p.receipts} />
      </Section>
      <Section title={t("detail.runs")} id="deliveries">
        <RunsPagedTable runs={p.runs} view={view} />
      </Section>
      <Section title={t("portal.fees")}>
        <AccountTable rows={rows.filter((r) => r.kind === "polishing-fee" || r.kind === "reversal")} testId="fees-table" exportName="grainline-fees" />
      </Section>
    </AccountFrame>
  );
}

type Portal = Pick<ReturnType<typeof growerPortal>, "party" | "ledger" | "statements">;

/**
 * What both accounts show around their own sections: what is owed first; then the payments,
 * every entry and the statements.
 */
async function AccountFrame({ portal: p, rows, title, intro, children, after }: { portal: Portal; rows: AccountRow[]; title: string; intro: string; children: React.ReactNode; after?: React.ReactNode }) {
  const t = await getTranslations("suppliers");
  return (
    <div className="space-y-8">
      <PageHeader title={title} intro={intro} wide />
      <BalancePanel title={t("portal.owed")} balanceYen={p.ledger.balanceYen} ageing={p.ledger.ageing} note={t("portal.owedNote")} />
      {children}
      <Section title={t("portal.payments")}>
        <AccountTable rows={rows.filter((r) => r.payment)} testId="payments-table" exportName="grainline-payments" />
      </Section>
      <Section title={t("detail.entries")}>
        <AccountTable rows={rows} />
      </Section>
      <Section title={t("portal.statements")}>
        <StatementsTable partyId={p.party.id} rows={p.statements.map(({ totals: _t, ...s }) => s)} />
      </Section>
      {after}
      <Section title={(await getTranslations("nav"))("language")}>
        <LanguageSetting action={setLanguageAction} current={(await requirePageUser()).locale} />
      </Section>
    </div>
  );
}

/** One titled block of an account page. */
function Section({ title, id, children }: { title: string; id?: string; children: React.ReactNode }) {
  return (
    <section className="space-y-3" id={id}>
      <h2 className="text-xl font-bold">{title}</h2>
      {children}
    </section>
  );
}

export default withClientMessages(["csv", "errors", "lot", "suppliers", "table"], AccountPage);
