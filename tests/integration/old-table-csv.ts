// The CSV an office browser table (src/components/data-table.tsx) wrote, made from the same
// tanstack table and tableCsv: the reference a server-rendered table's CSV must equal.
import { createTable, getCoreRowModel, getFilteredRowModel, getPaginationRowModel, getSortedRowModel, type ColumnDef } from "@tanstack/react-table";
import { tableCsv } from "@/components/data-table";
import type { Delivery, Run } from "@/server/suppliers/supplier-portal";

/** What the browser table's CSV held for these rows: its header line and cells, as csvText received them. */
export function oldTableCsv<T>(rows: T[], columns: ColumnDef<T, any>[]) {
  const table = createTable<T>({
    data: rows,
    columns,
    state: { sorting: [], globalFilter: "", columnPinning: {}, columnVisibility: {}, columnOrder: [] },
    onStateChange: () => {},
    renderFallbackValue: null,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getPaginationRowModel: getPaginationRowModel(),
  });
  let written: { headers: string[]; rows: unknown[][] } | null = null;
  tableCsv(table, (headers, cells) => ((written = { headers, rows: cells }), ""));
  return written!;
}

/** The columns of the browser table the page had (src/components/supplier-activity.tsx), values only. */
export const oldDeliveryColumns: ColumnDef<Delivery, any>[] = [
  { accessorKey: "at", header: "Date" },
  { accessorKey: "code", header: "Lot" },
  { accessorKey: "variety", header: "Variety" },
  { accessorKey: "cropYear", header: "Crop year" },
  { accessorKey: "grade", header: "Grade" },
  { accessorKey: "kg", header: "kg" },
  { accessorKey: "slip", header: "Slip" },
  { accessorKey: "receiver", header: "Received by" },
  { id: "amount", accessorFn: (r) => r.amountYen ?? "", header: "Amount" },
  { id: "status", accessorFn: (r) => (r.reversed ? "reversed" : ""), header: "Status" },
];

/** The columns of the browser table the page had (RunsTable, once in src/components/supplier-activity.tsx), values only. */
export const oldRunColumns: ColumnDef<Run, any>[] = [
  { accessorKey: "at", header: "Date" },
  { accessorKey: "polished", header: "Polished lot" },
  { accessorKey: "brownKg", header: "Brown rice kg" },
  { accessorKey: "targetPct", header: "Target" },
  { accessorKey: "achievedPct", header: "Achieved" },
  { id: "fee", accessorFn: (r) => r.feeYen ?? "", header: "Fee" },
  { id: "status", accessorFn: (r) => (r.reversed ? "reversed" : ""), header: "Status" },
];
