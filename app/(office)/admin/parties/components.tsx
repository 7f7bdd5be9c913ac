"use client";

import Link from "@/components/app-link";
import { useActionState } from "react";
import { useTranslations } from "next-intl";
import type { ColumnDef } from "@tanstack/react-table";
import { DataTable } from "@/components/data-table";
import { FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { PARTY_KINDS } from "@/domain/roles";
import { initialFormState } from "@/lib/form-state";
import { createPartyAction, updatePartyAction } from "./actions";

export type PartyRow = { id: string; kind: string; name: string; region: string; email: string; namedPublicly: boolean };

export function PartiesTable({ rows }: { rows: PartyRow[] }) {
  const t = useTranslations("parties");
  const columns: ColumnDef<PartyRow, any>[] = [
    { accessorKey: "name", header: t("name"), cell: (c) => <Link href={`/admin/parties/${c.row.original.id}`}>{c.getValue()}</Link> },
    { accessorKey: "kind", header: t("kind"), cell: (c) => t(`kinds.${c.getValue()}`) },
    { accessorKey: "region", header: t("region") },
    { accessorKey: "email", header: t("email") },
    { accessorKey: "namedPublicly", header: t("namedPubliclyShort"), cell: (c) => (c.getValue() ? t("yes") : t("no")) },
  ];
  return <DataTable data={rows} columns={columns} label={t("title")} testId="parties-table" />;
}

type PartyValues = Partial<Record<"id" | "kind" | "name" | "address" | "region" | "email" | "phone", string>> & { namedPublicly?: boolean };

export function PartyForm({ party }: { party?: PartyValues }) {
  const t = useTranslations("parties");
  const [state, action, pending] = useActionState(party?.id ? updatePartyAction : createPartyAction, initialFormState);
  const v = (name: keyof PartyValues) => (state.values?.[name] ?? party?.[name] ?? "") as string;
  return (
    <form action={action} className="grid gap-4 sm:grid-cols-2" noValidate key={state.ok && !party ? Date.now() : "form"}>
      <div className="sm:col-span-2">
        <FormMessage state={state} />
      </div>
      {party?.id ? <input type="hidden" name="id" value={party.id} /> : null}
      <div>
        <label htmlFor="kind" className="field-label">{t("kind")}</label>
        <select id="kind" name="kind" className="field-input" defaultValue={v("kind") || "grower"} disabled={Boolean(party?.id)}>
          {PARTY_KINDS.map((k) => (
            <option key={k} value={k}>{t(`kinds.${k}`)}</option>
          ))}
        </select>
        {party?.id ? <input type="hidden" name="kind" value={party.kind} /> : null}
      </div>
      <FormField label={t("name")} name="name" required defaultValue={v("name")} errors={state.fields?.name} />
      <FormField label={t("address")} name="address" defaultValue={v("address")} errors={state.fields?.address} />
      <FormField label={t("region")} name="region" defaultValue={v("region")} errors={state.fields?.region} />
      <FormField label={t("email")} name="email" type="email" defaultValue={v("email")} errors={state.fields?.email} />
      <FormField label={t("phone")} name="phone" type="tel" defaultValue={v("phone")} errors={state.fields?.phone} />
      <label className="flex items-center gap-3 sm:col-span-2">
        <input type="checkbox" name="namedPublicly" className="h-6 w-6" defaultChecked={party?.namedPublicly ?? false} />
        <span>{t("namedPublicly")}</span>
      </label>
      <div className="sm:col-span-2">
        <button type="submit" className="btn" disabled={pending}>{t("save")}</button>
      </div>
    </form>
  );
}
