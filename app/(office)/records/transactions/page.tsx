import { getTranslations } from "next-intl/server";
import { FormField } from "@/components/ui/form-field";
import { can } from "@/domain/permissions";
import { dayIn } from "@/i18n/dates";
import { actionTranslator } from "@/server/platform/action";
import { AppError } from "@/server/platform/errors";
import { requirePageUser } from "@/server/accounts/page-guard";
import { breweryTimeZone } from "@/server/platform/settings";
import { listTransactionRecords, parseDateRange, type TransactionRecord } from "@/server/records/transactions-export";
import { TransactionsTable } from "./components";
import { PageHeader } from "@/components/page-header";
import { CsvDownloadLinks } from "@/components/csv-download-links";
import { withClientMessages } from "@/i18n/client-messages";

export async function generateMetadata() {
  return { title: (await getTranslations("csv.records"))("title") };
}

type Search = Promise<Record<string, string | string[] | undefined>>;
const one = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v);

async function TransactionsPage({ searchParams }: { searchParams: Search }) {
  const user = await requirePageUser();
  const t = await getTranslations("csv.records");
  const query = await searchParams;
  // Unless asked otherwise: this calendar year so far, on the brewery's clock.
  const today = dayIn(new Date(), breweryTimeZone());
  const from = one(query.from) ?? `${today.slice(0, 4)}-01-01`;
  const to = one(query.to) ?? today;
  let records: TransactionRecord[] | null = null;
  let errors: Record<string, string[]> = {};
  const translate = await actionTranslator();
  try {
    records = listTransactionRecords(user, parseDateRange({ from, to }, translate), translate);
  } catch (error) {
    if (!(error instanceof AppError)) throw error;
    errors = error.fields ?? { _: [error.say(translate)] };
  }
  const download = `/api/records/transactions.csv?${new URLSearchParams({ from, to })}`;
  return (
    <div className="space-y-6">
      <PageHeader title={t("title")} intro={t("intro")} wide>
        {can(user, "records:read-all") ? null : <p className="mt-2 text-sm text-ink-soft">{t("scopeOwn")}</p>}
      </PageHeader>
      <form method="get" className="panel flex flex-wrap items-end gap-4" noValidate>
        <FormField label={t("from")} name="from" type="date" required defaultValue={from} errors={errors.from} />
        <FormField label={t("to")} name="to" type="date" required defaultValue={to} errors={errors.to} />
        <button type="submit" className="btn">{t("show")}</button>
        {records ? <CsvDownloadLinks href={download} label={t("download")} className="btn-quiet" testId="transactions-download" /> : null}
      </form>
      {records ? <TransactionsTable rows={records} exportName={`grainline-transactions-${from}-to-${to}`} /> : null}
    </div>
  );
}

export default withClientMessages(["csv", "errors", "table"], TransactionsPage);
