"use client";

import { useActionState } from "react";
import { useTranslations } from "next-intl";
import type { ColumnDef } from "@tanstack/react-table";
import { DataTable } from "@/components/data-table";
import { FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { initialFormState } from "@/lib/form-state";
import { CLAIMABLE_CATEGORIES } from "@/lib/validation/products";
import type { Product } from "@/server/ledger/products";
import { createProductAction } from "./actions";

export function ProductsTable({ rows }: { rows: Product[] }) {
  const t = useTranslations("products");
  const columns: ColumnDef<Product, any>[] = [
    { accessorKey: "name", header: t("name") },
    { accessorKey: "category", header: t("category"), cell: (c) => c.getValue() || t("noClaim") },
    { accessorKey: "bottleMl", header: t("bottleMl") },
    { accessorKey: "gtin", header: t("gtin"), cell: (c) => <span className="font-[family-name:var(--font-code)]">{c.getValue()}</span> },
  ];
  return <DataTable data={rows} columns={columns} label={t("title")} testId="products-table" />;
}

export function ProductForm() {
  const t = useTranslations("products");
  const [state, action, pending] = useActionState(createProductAction, initialFormState);
  const v = (name: string) => (state.ok ? "" : (state.values?.[name] ?? ""));
  return (
    // React resets a form after its action; remounting on each answer puts back what was typed (or clears it once saved).
    <form action={action} className="grid gap-4 sm:grid-cols-2" noValidate key={state.ok ? Date.now() : JSON.stringify(state.values ?? {})} data-testid="product-form">
      <div className="sm:col-span-2">
        <FormMessage state={state} />
      </div>
      <FormField label={t("name")} name="name" required defaultValue={v("name")} errors={state.fields?.name} />
      <div>
        <label htmlFor="category" className="field-label">{t("category")}</label>
        <select id="category" name="category" className="field-input" defaultValue={v("category")}>
          <option value="">{t("noClaim")}</option>
          {CLAIMABLE_CATEGORIES.map((c) => <option key={c} value={c}>{c}</option>)}
        </select>
        {state.fields?.category ? <p className="field-error">{state.fields.category.join(" ")}</p> : null}
      </div>
      <FormField label={t("bottleMl")} name="bottleMl" inputMode="numeric" required defaultValue={v("bottleMl") || "720"} errors={state.fields?.bottleMl} />
      <FormField label={t("gtin")} name="gtin" inputMode="numeric" required defaultValue={v("gtin")} errors={state.fields?.gtin} />
      <div className="sm:col-span-2">
        <button type="submit" className="btn" disabled={pending}>{t("save")}</button>
      </div>
    </form>
  );
}
