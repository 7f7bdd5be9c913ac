"use client";

import Link from "@/components/app-link";
import { usePathname, useRouter, useSearchParams } from "next/navigation";
import { flexRender, getCoreRowModel, useReactTable, type ColumnDef, type SortingState } from "@tanstack/react-table";
import { useFormatter, useTranslations } from "next-intl";
import { ScanCodeInput } from "@/components/floor/code-field";
import { GRADES } from "@/domain/grades";
import { LOT_KIND_LIST } from "@/domain/steps";
import type { ApiLot } from "@/server/ledger/lots";

type Query = { kind?: string; grade?: string; partyId?: string; variety?: string; cropYear?: string; q?: string; sort?: string; dir?: string; page: number };

/** The ledger's lot table: sorting, filters and pages are done by the server, kept in the URL. */
export function LedgerLotsTable({ rows, total, pageSize, query, holders }: { rows: ApiLot[]; total: number; pageSize: number; query: Query; holders: [string, string][] }) {
  const t = useTranslations();
  const format = useFormatter();
  const router = useRouter();
  const pathname = usePathname();
  const params = useSearchParams();
  const go = (changes: Record<string, string | undefined>) => {
    const next = new URLSearchParams(params.toString());
    for (const [k, v] of Object.entries(changes)) (v ? next.set(k, v) : next.delete(k));
    router.push(`${pathname}?${next.toString()}`);
  };
  const sorting: SortingState = query.sort ? [{ id: query.sort, desc: query.dir === "desc" }] : [];
  const columns: ColumnDef<ApiLot, any>[] = [
    { id: "code", accessorKey: "code", header: t("lot.code"), cell: (c) => <Link href={`/lots/${c.getValue()}`} className="code-chip no-underline">{c.getValue()}</Link> },
    { id: "kind", accessorKey: "kind", header: t("lot.kind"), cell: (c) => t(`lot.kinds.${c.getValue()}`) },
    { id: "variety", accessorKey: "variety", header: t("lot.variety") },
    { id: "cropYear", accessorKey: "cropYear", header: t("lot.cropYear") },
    { id: "grade", accessorKey: "grade", header: t("lot.grade"), cell: (c) => (c.getValue() ? t(`lot.grades.${c.getValue()}`) : "") },
    { id: "onHand", accessorKey: "onHand", header: t("lot.onHand"), cell: (c) => `${format.number(c.getValue(), { maximumFractionDigits: 1 })} ${c.row.original.unit}` },
    { id: "holder", accessorFn: (r) => r.party.name, header: t("lot.holder"), enableSorting: false },
    { id: "createdAt", accessorKey: "createdAt", header: t("lot.received"), cell: (c) => format.dateTime(new Date(c.getValue()), "day") },
  ];
  const table = useReactTable({
    data: rows,
    columns,
    state: { sorting },
    manualSorting: true,
    manualPagination: true,
    manualFiltering: true,
    pageCount: Math.max(1, Math.ceil(total / pageSize)),
    onSortingChange: (updater) => {
      const next = typeof updater === "function" ? updater(sorting) : updater;
      go({ sort: next[0]?.id, dir: next[0] ? (next[0].desc ? "desc" : "asc") : undefined, page: undefined });
    },
    getCoreRowModel: getCoreRowModel(),
  });
  const pages = table.getPageCount();

  return (
    <div className="space-y-4">
      <form className="panel flex flex-wrap items-end gap-3" action={pathname} method="get" data-testid="lot-filters">
        <Select name="kind" label={t("lot.kind")} value={query.kind} all={t("lotsPage.allKinds")} options={LOT_KIND_LIST.map((k) => [k, t(`lot.kinds.${k}`)])} />
        <Select name="grade" label={t("lot.grade")} value={query.grade} all={t("lotsPage.allGrades")} options={GRADES.map((g) => [g, t(`lot.grades.${g}`)])} />
        {holders.length ? <Select name="partyId" label={t("lot.holder")} value={query.partyId} all={t("lotsPage.allHolders")} options={holders} /> : null}
        <label><span className="field-label">{t("lotsPage.variety")}</span><input name="variety" defaultValue={query.variety} className="field-input w-40" /></label>
        <label><span className="field-label">{t("lotsPage.cropYear")}</span><input name="cropYear" inputMode="numeric" defaultValue={query.cropYear} className="field-input w-24" /></label>
        <div className="w-56"><ScanCodeInput id="lots-q" name="q" label={t("lotsPage.search")} defaultValue={query.q} /></div>
        <button type="submit" className="btn">{t("lotsPage.apply")}</button>
        <Link href={pathname} className="btn-quiet no-underline">{t("lotsPage.clear")}</Link>
        <span className="ml-auto text-sm text-ink-soft">{t("lotsPage.total", { count: total })}</span>
      </form>
      <div className="overflow-x-auto rounded-lg border-2 border-paper-deep bg-white">
        <table className="w-full text-sm" data-testid="ledger-lots">
          <thead className="bg-paper-deep text-left">
            {table.getHeaderGroups().map((g) => (
              <tr key={g.id}>
                {g.headers.map((h) => {
                  const sorted = h.column.getIsSorted();
                  return (
                    <th key={h.id} className="px-3 py-2" aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none"}>
                      {h.column.getCanSort() ? (
                        <button type="button" onClick={h.column.getToggleSortingHandler()} className="font-semibold">
                          {flexRender(h.column.columnDef.header, h.getContext())} <span aria-hidden="true">{sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : "↕"}</span>
                        </button>
                      ) : (
                        flexRender(h.column.columnDef.header, h.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.length === 0 ? (
              <tr><td colSpan={columns.length} className="px-3 py-6 text-center text-ink-soft">{t("table.empty")}</td></tr>
            ) : (
              table.getRowModel().rows.map((r) => (
                <tr key={r.id} className="border-t border-paper-deep">
                  {r.getVisibleCells().map((c) => <td key={c.id} className="px-3 py-2">{flexRender(c.column.columnDef.cell, c.getContext())}</td>)}
                </tr>
              ))
            )}
          </tbody>
        </table>
      </div>
      {pages > 1 ? (
        <nav className="flex items-center gap-3" aria-label={t("table.page", { page: query.page, pages })}>
          <button type="button" className="btn-quiet" disabled={query.page <= 1} onClick={() => go({ page: String(query.page - 1) })}>{t("table.previous")}</button>
          <span className="text-sm">{t("table.page", { page: query.page, pages })}</span>
          <button type="button" className="btn-quiet" disabled={query.page >= pages} onClick={() => go({ page: String(query.page + 1) })}>{t("table.next")}</button>
        </nav>
      ) : null}
    </div>
  );
}

function Select({ name, label, value, all, options }: { name: string; label: string; value?: string; all: string; options: [string, string][] }) {
  return (
    <label>
      <span className="field-label">{label}</span>
      <select name={name} defaultValue={value ?? ""} className="field-input">
        <option value="">{all}</option>
        {options.map(([v, text]) => <option key={v} value={v}>{text}</option>)}
      </select>
    </label>
  );
}
