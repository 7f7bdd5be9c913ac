"use client";

import { useActionState } from "react";
import { useTranslations } from "next-intl";
import type { ColumnDef } from "@tanstack/react-table";
import { DataTable } from "@/components/data-table";
import { FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { ROLES } from "@/domain/roles";
import { initialFormState } from "@/lib/form-state";
import { inviteUserAction } from "./actions";

export type UserRow = { id: string; name: string; email: string; role: string; partyName: string; status: "active" | "invited" };

export function UsersTable({ rows }: { rows: UserRow[] }) {
  const t = useTranslations();
  const columns: ColumnDef<UserRow, any>[] = [
    { accessorKey: "name", header: t("users.name") },
    { accessorKey: "email", header: t("users.email") },
    { accessorKey: "role", header: t("users.role"), cell: (c) => t(`roles.${c.getValue()}`) },
    { accessorKey: "partyName", header: t("users.party") },
    { accessorKey: "status", header: t("users.status"), cell: (c) => t(`users.statuses.${c.getValue()}`) },
  ];
  return <DataTable data={rows} columns={columns} label={t("users.title")} testId="users-table" />;
}

export function InviteForm({ parties }: { parties: { id: string; name: string; kind: string }[] }) {
  const t = useTranslations();
  const [state, action, pending] = useActionState(inviteUserAction, initialFormState);
  return (
    <form action={action} className="grid gap-4 sm:grid-cols-2" noValidate>
      <div className="sm:col-span-2">
        <FormMessage state={state} />
      </div>
      <FormField label={t("users.name")} name="name" required defaultValue={state.ok ? "" : state.values?.name} errors={state.fields?.name} />
      <FormField label={t("users.email")} name="email" type="email" required defaultValue={state.ok ? "" : state.values?.email} errors={state.fields?.email} />
      <div>
        <label htmlFor="role" className="field-label">{t("users.role")}</label>
        <select id="role" name="role" className="field-input" defaultValue={state.values?.role ?? "brewer"}>
          {ROLES.map((r) => (
            <option key={r} value={r}>{t(`roles.${r}`)}</option>
          ))}
        </select>
        {state.fields?.role ? <p className="field-error">{state.fields.role.join(" ")}</p> : null}
      </div>
      <div>
        <label htmlFor="partyId" className="field-label">{t("users.party")}</label>
        <select id="partyId" name="partyId" className="field-input" defaultValue={state.values?.partyId}>
          {parties.map((p) => (
            <option key={p.id} value={p.id}>{`${p.name} — ${t(`parties.kinds.${p.kind}`)}`}</option>
          ))}
        </select>
        {state.fields?.partyId ? <p className="field-error">{state.fields.partyId.join(" ")}</p> : null}
      </div>
      <div className="sm:col-span-2">
        <button type="submit" className="btn" disabled={pending}>{t("users.send")}</button>
      </div>
    </form>
  );
}
