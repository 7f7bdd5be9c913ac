"use client";

import { useActionState } from "react";
import { useTranslations } from "next-intl";
import type { ColumnDef } from "@tanstack/react-table";
import { DataTable } from "@/components/data-table";
import { FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { initialFormState } from "@/lib/form-state";
import { createFieldAction } from "./actions";

export type FieldRow = { id: string; name: string; region: string; areaHa: number; growerName: string };

export function FieldsTable({ rows, showGrower }: { rows: FieldRow[]; showGrower: boolean }) {
  const t = useTranslations("fields");
  const columns: ColumnDef<FieldRow, any>[] = [
    { accessorKey: "name", header: t("name") },
    ...(showGrower ? [{ accessorKey: "growerName", header: t("grower") } as ColumnDef<FieldRow, any>] : []),
    { accessorKey: "region", header: t("region") },
    { accessorKey: "areaHa", header: t("areaHa"), cell: (c) => Number(c.getValue()).toFixed(2) },
  ];
  return <DataTable data={rows} columns={columns} label={t("name")} testId="fields-table" />;
}

export function FieldForm({ growers }: { growers: { id: string; name: string }[] | null }) {
  const t = useTranslations("fields");
  const [state, action, pending] = useActionState(createFieldAction, initialFormState);
  const v = (k: string) => (state.ok ? "" : (state.values?.[k] ?? ""));
  return (
    <form action={action} className="grid gap-4 sm:grid-cols-3" noValidate key={state.ok ? `ok-${Date.now()}` : "form"}>
      <div className="sm:col-span-3">
        <FormMessage state={state} />
      </div>
      {growers ? (
        <div>
          <label htmlFor="growerId" className="field-label">{t("grower")}</label>
          <select id="growerId" name="growerId" className="field-input" defaultValue={v("growerId")}>
            {growers.map((g) => (
              <option key={g.id} value={g.id}>{g.name}</option>
            ))}
          </select>
        </div>
      ) : null}
      <FormField label={t("name")} name="name" required defaultValue={v("name")} errors={state.fields?.name} />
      <FormField label={t("region")} name="region" required defaultValue={v("region")} errors={state.fields?.region} />
      <FormField label={t("areaHa")} name="areaHa" inputMode="decimal" required defaultValue={v("areaHa")} errors={state.fields?.areaHa} />
      <FormField label={t("latitude")} name="latitude" inputMode="decimal" defaultValue={v("latitude")} errors={state.fields?.latitude} />
      <FormField label={t("longitude")} name="longitude" inputMode="decimal" defaultValue={v("longitude")} errors={state.fields?.longitude} />
      <div className="sm:col-span-3">
        <button type="submit" className="btn" disabled={pending}>{t("save")}</button>
      </div>
    </form>
  );
}
