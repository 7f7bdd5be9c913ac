"use client";

import { useFormatter, useTranslations } from "next-intl";
import type { ColumnDef } from "@tanstack/react-table";
import { AGEING_BUCKETS, type Ageing } from "@/domain/ageing";
import type { AccountRow } from "@/server/suppliers/supplier-describe";
import { CsvDownloadLinks } from "./csv-download-links";
import { DataTable } from "./data-table";

export function useYen() {
  const format = useFormatter();
  return (v: number) => format.number(v, { style: "currency", currency: "JPY" });
}

/** The balance owed, large, with its ageing beside it. */
export function BalancePanel({ title, balanceYen, ageing, note }: { title: string; balanceYen: number; ageing: Ageing; note?: string }) {
  const t = useTranslations("suppliers");
  const yen = useYen();
  return (
    <section className="panel grid gap-4 sm:grid-cols-[auto_1fr]" data-testid="balance-panel">
      <div>
        <h2 className="text-sm font-semibold text-ink-soft">{title}</h2>
        <p className="font-[family-name:var(--font-display)] text-4xl font-bold text-cedar-deep" data-testid="balance">{yen(balanceYen)}</p>
        {note ? <p className="mt-1 max-w-xs text-xs text-ink-soft">{note}</p> : null}
      </div>
      <div>
        <h3 className="text-sm font-semibold text-ink-soft">{t("ageing.title")}</h3>
        <dl className="mt-1 grid grid-cols-2 gap-2 sm:grid-cols-4" data-testid="ageing">
          {AGEING_BUCKETS.map((b) => (
            <div key={b} className="rounded border border-paper-deep bg-white px-3 py-2">
              <dt className="text-xs text-ink-soft">{t(`ageing.${b}`)}</dt>
              <dd className="font-semibold">{yen(ageing[b])}</dd>
            </div>
          ))}
        </dl>
        <p className="mt-1 text-xs text-ink-soft">{t("ageing.note")}</p>
      </div>
    </section>
  );
}

export function AccountTable({ rows, testId = "account-table", exportName = "grainline-account" }: { rows: AccountRow[]; testId?: string; exportName?: string }) {
  const t = useTranslations("suppliers");
  const format = useFormatter();
  const yen = useYen();
  const columns: ColumnDef<AccountRow, any>[] = [
    { accessorKey: "at", header: t("columns.date"), cell: (c) => format.dateTime(c.getValue(), "day") },
    { accessorKey: "kind", header: t("columns.entry"), cell: (c) => t(`kinds.${c.getValue()}`) },
    { accessorKey: "description", header: t("columns.description") },
    { accessorKey: "taxRatePct", header: t("columns.rate"), cell: (c) => t(`rates.${c.getValue()}`) },
    { accessorKey: "amountYen", header: t("columns.amount"), cell: (c) => <span className={c.getValue() < 0 ? "text-persimmon" : ""}>{yen(c.getValue())}</span> },
    { id: "statement", accessorFn: (r) => r.statement ?? "", header: t("columns.statement"), cell: (c) => c.getValue() || <span className="text-ink-soft">{t("notStated")}</span> },
  ];
  return <DataTable data={rows} columns={columns} label={t("detail.entries")} testId={testId} exportName={exportName} pageSize={50} />;
}

export type StatementRow = { number: string; from: string; to: string; issuedAt: Date; grossYen: number; balanceYen: number };

export function StatementsTable({ partyId, rows }: { partyId: string; rows: StatementRow[] }) {
  const t = useTranslations("suppliers");
  const format = useFormatter();
  const yen = useYen();
  const base = (n: string) => `/api/suppliers/${encodeURIComponent(partyId)}/statements/${encodeURIComponent(n)}`;
  const columns: ColumnDef<StatementRow, any>[] = [
    { accessorKey: "number", header: t("columns.statement") },
    { id: "period", accessorFn: (r) => `${r.from} – ${r.to}`, header: t("columns.period") },
    { accessorKey: "issuedAt", header: t("columns.issued"), cell: (c) => format.dateTime(c.getValue(), "day") },
    { accessorKey: "grossYen", header: t("columns.total"), cell: (c) => yen(c.getValue()) },
    { accessorKey: "balanceYen", header: t("columns.balance"), cell: (c) => yen(c.getValue()) },
    {
      id: "files",
      header: t("columns.files"),
      cell: (c) => (
        <span className="flex gap-3">
          <a href={`${base(c.row.original.number)}/statement.pdf`} download>{t("statements.pdf")}</a>
          <CsvDownloadLinks href={`${base(c.row.original.number)}/statement.csv`} label={t("statements.csv")} />
        </span>
      ),
    },
  ];
  return <DataTable data={rows} columns={columns} label={t("statements.title")} testId="statements-table" exportName="grainline-statements" />;
}
