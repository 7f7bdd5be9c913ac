"use client";

import Link from "@/components/app-link";
import { useFormatter, useTranslations } from "next-intl";
import type { ColumnDef } from "@tanstack/react-table";
import type { Delivery, Receipt } from "@/server/suppliers/supplier-portal";
import { DataTable } from "./data-table";
import { useYen } from "./supplier-account";

const lotLink = (code: string | null, linked: boolean) => (code ? (linked ? <Link className="code-chip no-underline" href={`/lots/${code}`}>{code}</Link> : <span className="code-chip">{code}</span>) : "");

/** A grower's deliveries and what each was priced at; "no contract price" where none was. */
export function DeliveriesTable({ rows, testId = "deliveries-table", linkLots = true }: { rows: Delivery[]; testId?: string; linkLots?: boolean }) {
  const t = useTranslations("suppliers");
  const tl = useTranslations("lot");
  const format = useFormatter();
  const yen = useYen();
  const columns: ColumnDef<Delivery, any>[] = [
    { accessorKey: "at", header: t("columns.date"), cell: (c) => format.dateTime(c.getValue(), "day") },
    { accessorKey: "code", header: t("columns.lot"), cell: (c) => lotLink(c.getValue(), linkLots) },
    { accessorKey: "variety", header: t("columns.variety") },
    { accessorKey: "cropYear", header: t("columns.cropYear") },
    { accessorKey: "grade", header: t("columns.grade"), cell: (c) => (c.getValue() ? tl(`grades.${c.getValue()}`) : "") },
    { accessorKey: "kg", header: t("columns.kg"), cell: (c) => format.number(c.getValue(), { maximumFractionDigits: 1 }) },
    { accessorKey: "slip", header: t("columns.slip") },
    { accessorKey: "receiver", header: t("columns.receiver") },
    { id: "amount", accessorFn: (r) => r.amountYen ?? "", header: t("columns.amount"), cell: (c) => (c.row.original.amountYen === null ? <span className="text-persimmon">{t("noPrice")}</span> : yen(c.row.original.amountYen)) },
    { id: "status", accessorFn: (r) => (r.reversed ? t("reversed") : ""), header: t("columns.status") },
  ];
  return <DataTable data={rows} columns={columns} label={t("detail.deliveries")} testId={testId} exportName="grainline-deliveries" />;
}

export function ReceiptsTable({ rows }: { rows: Receipt[] }) {
  const t = useTranslations("suppliers");
  const tl = useTranslations("lot");
  const format = useFormatter();
  const columns: ColumnDef<Receipt, any>[] = [
    { accessorKey: "at", header: t("columns.date"), cell: (c) => format.dateTime(c.getValue(), "day") },
    { accessorKey: "code", header: t("columns.lot"), cell: (c) => lotLink(c.getValue(), true) },
    { accessorKey: "kind", header: tl("kind"), cell: (c) => tl(`kinds.${c.getValue()}`) },
    { accessorKey: "variety", header: t("columns.variety") },
    { accessorKey: "grade", header: t("columns.grade"), cell: (c) => (c.getValue() ? tl(`grades.${c.getValue()}`) : "") },
    { id: "quantity", accessorFn: (r) => r.quantity, header: t("columns.kg"), cell: (c) => `${format.number(c.getValue(), { maximumFractionDigits: 1 })} ${c.row.original.unit}` },
    { accessorKey: "from", header: t("columns.from") },
    { accessorKey: "slip", header: t("columns.slip") },
    { id: "status", accessorFn: (r) => (r.reversed ? t("reversed") : ""), header: t("columns.status") },
  ];
  return <DataTable data={rows} columns={columns} label={t("detail.receipts")} testId="receipts-table" exportName="grainline-receipts" />;
}
