"use client";

import {
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getPaginationRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type SortingState,
  type Table,
} from "@tanstack/react-table";
import { useState } from "react";
import { useTranslations } from "next-intl";
import { CsvButtons, useCsvSave } from "./csv-buttons";

type Props<T> = {
  data: T[];
  columns: ColumnDef<T, any>[];
  pageSize?: number;
  label: string;
  testId?: string;
  exportName?: string;
  /** A stable key per row, for rows whose cells hold state (a form's answer) while rows come and go. */
  rowId?: (row: T) => string;
};

/** The office's table: sortable headers, one filter box over every column, pages, and a CSV of what it shows. */
export function DataTable<T>({ data, columns, pageSize = 25, label, testId, exportName = "grainline-export", rowId }: Props<T>) {
  const t = useTranslations("table");
  const [sorting, setSorting] = useState<SortingState>([]);
  const [globalFilter, setGlobalFilter] = useState("");
  const table = useReactTable({
    data,
    columns,
    state: { sorting, globalFilter },
    onSortingChange: setSorting,
    onGlobalFilterChange: setGlobalFilter,
    getRowId: rowId ? (row) => rowId(row) : undefined,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getPaginationRowModel: getPaginationRowModel(),
    initialState: { pagination: { pageSize } },
  });
  const rows = table.getRowModel().rows;
  const save = useCsvSave(exportName, (csvText) => tableCsv(table, csvText));
  const pages = Math.max(1, table.getPageCount());

  return (
    <div className="space-y-3" data-testid={testId}>
      <div className="flex flex-wrap items-end justify-between gap-3">
        <label className="text-sm">
          <span className="field-label">{t("filter")}</span>
          <input value={globalFilter} onChange={(e) => setGlobalFilter(e.target.value)} placeholder={t("filterPlaceholder")} className="field-input w-72" aria-label={`${t("filter")}: ${label}`} />
        </label>
        <div className="flex items-center gap-3">
          <p className="text-sm text-ink-soft">{t("rows", { count: table.getFilteredRowModel().rows.length })}</p>
          <CsvButtons save={save} testId={testId} />
        </div>
      </div>
      {save.problem ? <p role="alert" className="notice-warn">{save.problem}</p> : null}
      <div className="overflow-x-auto rounded-lg border-2 border-paper-deep bg-white">
        <table className="w-full border-collapse text-sm" aria-label={label}>
          <thead className="bg-paper-deep text-left">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  return (
                    <th key={header.id} scope="col" aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none"} className="px-3 py-2 font-semibold">
                      {header.isPlaceholder ? null : header.column.getCanSort() ? (
                        <button type="button" onClick={header.column.getToggleSortingHandler()} className="flex items-center gap-1" title={t("sortBy", { column: String(header.column.columnDef.header) })}>
                          {flexRender(header.column.columnDef.header, header.getContext())}
                          <span aria-hidden="true">{sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : "↕"}</span>
                        </button>
                      ) : (
                        flexRender(header.column.columnDef.header, header.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {rows.length === 0 ? (
              <tr>
                <td colSpan={columns.length} className="px-3 py-6 text-center text-ink-soft">
                  {t("empty")}
                </td>
              </tr>
            ) : (
              rows.map((row) => (
                <tr key={row.id} className="border-t border-paper-deep odd:bg-paper/40">
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className="px-3 py-2 align-top">
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              ))
            )}
          </tbody>
        </table>
      </div>
      {pages > 1 ? (
        <div className="flex items-center gap-3">
          <button type="button" className="btn-quiet" onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage()}>
            {t("previous")}
          </button>
          <span className="text-sm">{t("page", { page: table.getState().pagination.pageIndex + 1, pages })}</span>
          <button type="button" className="btn-quiet" onClick={() => table.nextPage()} disabled={!table.getCanNextPage()}>
            {t("next")}
          </button>
        </div>
      ) : null}
    </div>
  );
}

/**
 * The rows the table holds after its filter and sort, every page, in its visible columns:
 * each cell's plain value (what the column reads from the row, not what it draws), dates
 * as ISO 8601. Columns that only draw (no accessor) are left out.
 */
export function tableCsv<T>(table: Table<T>, csvText: (headers: string[], rows: unknown[][]) => string): string {
  const columns = table.getVisibleLeafColumns().filter((c) => c.accessorFn);
  const headers = columns.map((c) => (typeof c.columnDef.header === "string" ? c.columnDef.header : c.id));
  const rows = table.getPrePaginationRowModel().rows.map((row) => columns.map((c) => plainValue(row.getValue(c.id))));
  return csvText(headers, rows);
}

function plainValue(value: unknown): unknown {
  if (value == null) return "";
  if (value instanceof Date) return value.toISOString();
  if (typeof value === "object") return JSON.stringify(value);
  return value;
}
