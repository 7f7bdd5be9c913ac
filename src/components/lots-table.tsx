"use client";

import { useFormatter, useTranslations } from "next-intl";
import type { ColumnDef } from "@tanstack/react-table";
import { DataTable } from "./data-table";

export type LotRow = { code: string; kind: string; unit: string; onHand: number; variety: string | null; cropYear: number | null; grade: string | null; partyName: string; region: string | null; createdAt: Date };

export function LotsTable({ rows }: { rows: LotRow[] }) {
  const t = useTranslations("lot");
  const format = useFormatter();
  const columns: ColumnDef<LotRow, any>[] = [
    { accessorKey: "code", header: t("code"), cell: (c) => <span className="code-chip">{c.getValue()}</span> },
    { accessorKey: "kind", header: t("kind"), cell: (c) => t(`kinds.${c.getValue()}`) },
    { accessorKey: "variety", header: t("variety") },
    { accessorKey: "cropYear", header: t("cropYear") },
    { accessorKey: "grade", header: t("grade") },
    { accessorKey: "onHand", header: t("onHand"), cell: (c) => `${format.number(c.getValue(), { maximumFractionDigits: 1 })} ${c.row.original.unit}` },
    { accessorKey: "region", header: t("region") },
    { accessorKey: "createdAt", header: t("received"), cell: (c) => format.dateTime(c.getValue(), { dateStyle: "medium" }) },
  ];
  return <DataTable data={rows} columns={columns} label={t("code")} testId="lots-table" />;
}
