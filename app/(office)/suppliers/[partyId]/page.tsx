import Link from "@/components/app-link";
import { forbidden, notFound } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { AccountTable, BalancePanel, StatementsTable } from "@/components/supplier-account";
import { can } from "@/domain/permissions";
import { dayIn, nextDay } from "@/i18n/dates";
import { actionTranslator } from "@/server/platform/action";
import { getDb } from "@/server/platform/db";
import { breweryTimeZone } from "@/server/platform/settings";
import { requirePageUser } from "@/server/accounts/page-guard";
import { currentMillContract, listContracts } from "@/server/suppliers/supplier-contracts";
import { accountRows } from "@/server/suppliers/supplier-describe";
import { ledgerOf } from "@/server/suppliers/supplier-ledger";
import { paymentLines } from "@/server/suppliers/supplier-payments";
import { deliveriesOf, runKeysOf } from "@/server/suppliers/supplier-portal";
import { listStatements } from "@/server/suppliers/supplier-statements";
import { getParty } from "@/server/ledger/parties";
import { ContractsTable, GrowerContractForm, MillContractForm } from "./contract-forms";
import { AdjustmentForm, InvoiceNumberForm, StatementForm } from "./components";
import { PaymentForm, PaymentsList } from "./payment-forms";
import { DeliveriesPagedTable } from "@/components/supplier-lists/deliveries-table";
import { accountListHref, type AccountListView } from "@/components/supplier-lists/account-list-view";
import { isUnpriced } from "@/components/supplier-lists/deliveries-view";
import { RunsPagedTable } from "@/components/supplier-lists/runs-table";
import { isUnpricedRun } from "@/components/supplier-lists/runs-view";
import { withClientMessages } from "@/i18n/client-messages";

type Search = { page?: string | string[]; unpriced?: string | string[] };
const first = (value: string | string[] | undefined) => (Array.isArray(value) ? value[0] : value);

async function SupplierPage({ params, searchParams }: { params: Promise<{ partyId: string }>; searchParams: Promise<Search> }) {
  const user = await requirePageUser();
  if (!can(user, "ledger:read-all")) forbidden();
  const { partyId } = await params;
  const party = getParty(partyId);
  if (!party || (party.kind !== "grower" && party.kind !== "mill")) notFound();
  const t = await getTranslations("suppliers");
  const translate = await actionTranslator();
  const manage = can(user, "ledger:manage");
  const ledger = ledgerOf(getDb(), partyId);
  const deliveries = party.kind === "grower" ? deliveriesOf(partyId) : [];
  const runs = party.kind === "mill" ? runKeysOf(partyId) : [];
  const search = await searchParams;
  const view: AccountListView = { partyId, page: Number(first(search.page)) || 1, unpricedOnly: first(search.unpriced) === "1" };
  // A grower's deliveries or a mill's runs: either list is empty for the other kind.
  const unpriced = deliveries.filter(isUnpriced).length + runs.filter(isUnpricedRun).length;
  const zone = breweryTimeZone();
  const payments = manage ? paymentLines(ledger, translate, zone) : [];
  const today = dayIn(new Date(), zone);
  const statements = listStatements(partyId).map(({ totals: _t, ...s }) => s);
  const lastTo = statements.at(-1)?.to;
  const from = lastTo ? nextDay(lastTo) : `${today.slice(0, 8)}01`;
  return (
    <div className="space-y-8">
      <p><Link href="/suppliers">← {t("back")}</Link></p>
      <header>
        <h1 className="text-3xl font-bold">{party.name}</h1>
        <p className="text-ink-soft">{t(`kindLabels.${party.kind}`)} · {t("detail.invoice")}: <span data-testid="invoice-number">{party.invoiceNumber ?? t("detail.invoiceNone")}</span></p>
      </header>
      <BalancePanel title={t("detail.balance")} balanceYen={ledger.balanceYen} ageing={ledger.ageing} note={t("portal.owedNote")} />
      {manage ? (
        <section className="panel max-w-3xl space-y-2">
          <h2 className="text-xl font-bold">{t("detail.invoice")}</h2>
          <p className="text-sm text-ink-soft">{t("detail.invoiceIntro")}</p>
          <InvoiceNumberForm partyId={partyId} current={party.invoiceNumber ?? ""} />
        </section>
      ) : null}
      <section className="space-y-3">
        <h2 className="text-xl font-bold">{t("detail.contracts")}</h2>
        <p className="max-w-3xl text-sm text-ink-soft">{t("detail.contractsIntro")}</p>
        <ContractsTable rows={listContracts(partyId)} />
        {manage ? (
          <div className="panel">
            <h3 className="mb-3 text-lg font-bold">{party.kind === "grower" ? t("growerContract.title") : t("millContract.title")}</h3>
            {party.kind === "grower" ? <GrowerContractForm partyId={partyId} defaultYear={Number(today.slice(0, 4))} /> : <MillContractForm partyId={partyId} current={currentMillContract(getDb(), partyId)?.terms.tiers ?? []} />}
          </div>
        ) : null}
      </section>
      <section className="space-y-3" data-testid="unpriced">
        <h2 className="text-xl font-bold">{party.kind === "grower" ? t("detail.unpriced") : t("detail.unpricedRuns")}</h2>
        {party.kind === "grower" ? <p className="max-w-3xl text-sm text-ink-soft">{t("detail.unpricedIntro")}</p> : null}
        {unpriced ? (
          // What no contract priced is listed once, in the table below, marked there and shown alone on a click.
          <p className="flex flex-wrap items-center gap-3" data-testid="unpriced-count">
            {party.kind === "grower" ? t("detail.unpricedCount", { count: unpriced }) : t("detail.unpricedRunsCount", { count: unpriced })}
            {view.unpricedOnly ? null : <Link href={accountListHref({ ...view, page: 1, unpricedOnly: true })} className="btn-quiet">{party.kind === "grower" ? t("detail.showUnpriced") : t("detail.showUnpricedRuns")}</Link>}
          </p>
        ) : (
          <p className="notice">{party.kind === "grower" ? t("detail.unpricedNone") : t("detail.unpricedRunsNone")}</p>
        )}
      </section>
      <section className="space-y-3" id="deliveries">
        <h2 className="text-xl font-bold">{party.kind === "grower" ? t("detail.deliveries") : t("detail.runs")}</h2>
        {party.kind === "grower" ? <DeliveriesPagedTable deliveries={deliveries} view={view} /> : <RunsPagedTable runs={runs} view={view} />}
      </section>
      <section className="space-y-3">
        <h2 className="text-xl font-bold">{t("detail.entries")}</h2>
        <p className="max-w-3xl text-sm text-ink-soft">{t("detail.entriesIntro")}</p>
        <AccountTable rows={accountRows(ledger, translate)} exportName={`grainline-account-${partyId}`} />
      </section>
      {manage ? (
        <div className="grid gap-6 lg:grid-cols-2">
          <section className="panel space-y-3">
            <h2 className="text-xl font-bold">{t("payment.title")}</h2>
            <PaymentForm partyId={partyId} today={today} balanceYen={ledger.balanceYen} />
          </section>
          <section className="panel space-y-3">
            <h2 className="text-xl font-bold">{t("adjustment.title")}</h2>
            <p className="text-sm text-ink-soft">{t("adjustment.intro")}</p>
            <AdjustmentForm partyId={partyId} today={today} />
          </section>
        </div>
      ) : null}
      {manage && payments.length ? (
        <section className="space-y-3">
          <h2 className="text-xl font-bold">{t("payment.listTitle")}</h2>
          <p className="max-w-3xl text-sm text-ink-soft">{t("payment.listIntro")}</p>
          <PaymentsList partyId={partyId} rows={payments} />
        </section>
      ) : null}
      <section className="space-y-3">
        <h2 className="text-xl font-bold">{t("statements.title")}</h2>
        <p className="max-w-3xl text-sm text-ink-soft">{t("statements.intro")}</p>
        <StatementsTable partyId={partyId} rows={statements} />
        {manage ? (
          <div className="panel max-w-3xl">
            <StatementForm partyId={partyId} from={from > today ? today : from} to={today} hasEmail={Boolean(party.email)} />
          </div>
        ) : null}
      </section>
    </div>
  );
}

export default withClientMessages(["csv", "errors", "lot", "suppliers", "table"], SupplierPage);
