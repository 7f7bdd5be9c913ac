"use client";

import Link from "@/components/app-link";
import { useFormatter, useTranslations } from "next-intl";
import type { ColumnDef } from "@tanstack/react-table";
import { DataTable } from "@/components/data-table";

export type OutboxRow = { id: string; to: string; subject: string; transport: string; createdAt: Date };

export function OutboxTable({ rows }: { rows: OutboxRow[] }) {
  const t = useTranslations("outbox");
  const format = useFormatter();
  const columns: ColumnDef<OutboxRow, any>[] = [
    { accessorKey: "createdAt", header: t("sentAt"), cell: (c) => format.dateTime(c.getValue(), "dayTime") },
    { accessorKey: "to", header: t("to") },
    { accessorKey: "subject", header: t("subject"), cell: (c) => <Link href={`/admin/outbox/${c.row.original.id}`}>{c.getValue()}</Link> },
    { accessorKey: "transport", header: t("transport"), cell: (c) => t(`transports.${c.getValue()}`) },
  ];
  return <DataTable data={rows} columns={columns} label={t("title")} testId="outbox-table" />;
}
