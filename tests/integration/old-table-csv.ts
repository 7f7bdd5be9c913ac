// The CSV an office browser table (src/components/data-table.tsx) wrote, made from the same
// tanstack table and tableCsv: the reference a server-rendered table's CSV must equal.
import { createTable, getCoreRowModel, getFilteredRowModel, getPaginationRowModel, getSortedRowModel, type ColumnDef } from "@tanstack/react-table";
import { tableCsv } from "@/components/data-table";

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
