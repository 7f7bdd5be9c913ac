"use client";

import { useFormatter, useTranslations } from "next-intl";
import type { ColumnDef } from "@tanstack/react-table";
import { DataTable } from "./data-table";

/** A line of the audit record, already worded from the catalogue on the server (src/server/records/audit-record.ts). */
export type AuditRow = { id: string; at: Date; userName: string; summary: string };

export function AuditTable({ rows, pageSize }: { rows: AuditRow[]; pageSize?: number }) {
  const t = useTranslations("audit");
  const format = useFormatter();
  const columns: ColumnDef<AuditRow, any>[] = [
    { accessorKey: "at", header: t("at"), cell: (c) => format.dateTime(c.getValue(), "dayTime") },
    { accessorKey: "userName", header: t("user") },
    { accessorKey: "summary", header: t("summary"), enableSorting: false },
  ];
  return <DataTable data={rows} columns={columns} label={t("summary")} pageSize={pageSize} testId="audit-table" />;
}
