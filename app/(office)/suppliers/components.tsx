"use client";

import Link from "@/components/app-link";
import { useActionState } from "react";
import { useTranslations } from "next-intl";
import type { ColumnDef } from "@tanstack/react-table";
import { DataTable } from "@/components/data-table";
import { useYen } from "@/components/supplier-account";
import { FormMessage } from "@/components/ui/form-message";
import { AGEING_BUCKETS, type Ageing } from "@/domain/ageing";
import { ROUNDINGS, type Rounding } from "@/domain/money";
import { initialFormState } from "@/lib/form-state";
import { saveRoundingAction } from "./actions";

export type SupplierRow = { id: string; name: string; kind: string; invoiceNumber: string | null; balanceYen: number; ageing: Ageing };

export function SuppliersTable({ rows }: { rows: SupplierRow[] }) {
  const t = useTranslations("suppliers");
  const yen = useYen();
  const columns: ColumnDef<SupplierRow, any>[] = [
    { accessorKey: "name", header: t("columns.name"), cell: (c) => <Link href={`/suppliers/${c.row.original.id}`}>{c.getValue()}</Link> },
    { accessorKey: "kind", header: t("columns.kind"), cell: (c) => t(`kindLabels.${c.getValue()}`) },
    { id: "invoiceNumber", accessorFn: (r) => r.invoiceNumber ?? "", header: t("columns.invoiceNumber"), cell: (c) => c.getValue() || <span className="text-ink-soft">{t("detail.invoiceNone")}</span> },
    { accessorKey: "balanceYen", header: t("columns.balance"), cell: (c) => <strong>{yen(c.getValue())}</strong> },
    ...AGEING_BUCKETS.map((b): ColumnDef<SupplierRow, any> => ({ id: b, accessorFn: (r) => r.ageing[b], header: t(`ageing.${b}`), cell: (c) => yen(c.getValue()) })),
  ];
  return <DataTable data={rows} columns={columns} label={t("title")} testId="suppliers-table" exportName="grainline-suppliers" />;
}

export function RoundingForm({ current }: { current: Rounding }) {
  const t = useTranslations("suppliers.rounding");
  const [state, action, pending] = useActionState(saveRoundingAction, initialFormState);
  return (
    <form action={action} className="space-y-3" data-testid="rounding-form">
      <FormMessage state={state} />
      <fieldset>
        <legend className="field-label">{t("label")}</legend>
        <div className="mt-1 flex flex-wrap gap-4">
          {ROUNDINGS.map((r) => (
            <label key={r} className="flex items-center gap-2">
              <input type="radio" name="rounding" value={r} defaultChecked={r === current} />
              {t(r)}
            </label>
          ))}
        </div>
      </fieldset>
      <button type="submit" className="btn" disabled={pending}>{t("save")}</button>
    </form>
  );
}
