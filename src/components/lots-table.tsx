"use client";

import Link from "@/components/app-link";
import { useFormatter, useTranslations } from "next-intl";
import type { ColumnDef } from "@tanstack/react-table";
import type { ApiLot } from "@/server/ledger/lots";
import { DataTable } from "./data-table";

/** A short list of lots (a queue, a selection), sorted and filtered in the browser. */
export function LotsTable({ rows }: { rows: ApiLot[] }) {
  const t = useTranslations("lot");
  const format = useFormatter();
  const columns: ColumnDef<ApiLot, any>[] = [
    { accessorKey: "code", header: t("code"), cell: (c) => <Link className="code-chip no-underline" href={`/lots/${c.getValue()}`}>{c.getValue()}</Link> },
    { accessorKey: "kind", header: t("kind"), cell: (c) => t(`kinds.${c.getValue()}`) },
    { accessorKey: "variety", header: t("variety") },
    { accessorKey: "cropYear", header: t("cropYear") },
    { accessorKey: "grade", header: t("grade"), cell: (c) => (c.getValue() ? t(`grades.${c.getValue()}`) : "") },
    { accessorKey: "onHand", header: t("onHand"), cell: (c) => `${format.number(c.getValue(), { maximumFractionDigits: 1 })} ${c.row.original.unit}` },
    { id: "holder", accessorFn: (r) => r.party.name, header: t("holder") },
    { id: "region", accessorFn: (r) => r.field?.region ?? "", header: t("region") },
    { accessorKey: "createdAt", header: t("received"), cell: (c) => format.dateTime(new Date(c.getValue()), "day") },
  ];
  return <DataTable data={rows} columns={columns} label={t("code")} testId="lots-table" />;
}
