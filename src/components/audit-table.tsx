"use client";

import { useFormatter, useTranslations } from "next-intl";
import type { ColumnDef } from "@tanstack/react-table";
import { DataTable } from "./data-table";

export type AuditRow = { id: number; at: Date; userName: string; action: string; subject: string; detail: string };

export function AuditTable({ rows, pageSize }: { rows: AuditRow[]; pageSize?: number }) {
  const t = useTranslations("audit");
  const format = useFormatter();
  // Catalogue keys cannot hold dots (they mean nesting), so "user.invited" is "user_invited".
  const actionLabel = (action: string) => {
    const key = `actions.${action.replace(".", "_")}`;
    return t.has(key) ? t(key) : action;
  };
  const columns: ColumnDef<AuditRow, any>[] = [
    { accessorKey: "at", header: t("at"), cell: (c) => format.dateTime(c.getValue(), { dateStyle: "medium", timeStyle: "medium" }) },
    { accessorKey: "userName", header: t("user") },
    { accessorKey: "action", header: t("action"), cell: (c) => actionLabel(c.getValue()) },
    { accessorKey: "subject", header: t("subject"), cell: (c) => <span className="code-chip">{c.getValue()}</span> },
    { accessorKey: "detail", header: t("detail"), cell: (c) => <code className="text-xs break-all">{c.getValue()}</code>, enableSorting: false },
  ];
  return <DataTable data={rows} columns={columns} label={t("action")} pageSize={pageSize} testId="audit-table" />;
}
