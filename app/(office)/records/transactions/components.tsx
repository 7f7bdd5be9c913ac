"use client";

import { useTranslations } from "next-intl";
import type { ColumnDef } from "@tanstack/react-table";
import { DataTable } from "@/components/data-table";
import type { TransactionRecord } from "@/server/records/transactions-export";

export function TransactionsTable({ rows, exportName }: { rows: TransactionRecord[]; exportName: string }) {
  const t = useTranslations("csv.records");
  const columns: ColumnDef<TransactionRecord, any>[] = [
    { accessorKey: "date", header: t("columns.date") },
    { id: "direction", accessorFn: (r) => t(`directions.${r.direction}`), header: t("columns.direction") },
    { id: "entry", accessorFn: (r) => t(r.reversal ? "entries.reversal" : "entries.record"), header: t("columns.entry") },
    { accessorKey: "product", header: t("columns.product") },
    { accessorKey: "lot", header: t("columns.lot"), cell: (c) => <span className="code-chip">{c.getValue()}</span> },
    { accessorKey: "origin", header: t("columns.origin") },
    { accessorKey: "quantity", header: t("columns.quantity") },
    { accessorKey: "unit", header: t("columns.unit") },
    { accessorKey: "party", header: t("columns.party") },
    { accessorKey: "counterparty", header: t("columns.counterparty") },
    { accessorKey: "place", header: t("columns.place") },
    { accessorKey: "deliverySlip", header: t("columns.deliverySlip") },
    { accessorKey: "recordedBy", header: t("columns.recordedBy") },
  ];
  return <DataTable data={rows} columns={columns} label={t("title")} exportName={exportName} testId="transactions-table" />;
}
