"use client";

import { useActionState, useState } from "react";
import { useTranslations } from "next-intl";
import type { CellContext, ColumnDef } from "@tanstack/react-table";
import { DataTable } from "@/components/data-table";
import { FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { PARTY_KIND_FOR_ROLE, ROLES, type Role } from "@/domain/roles";
import { initialFormState } from "@/lib/form-state";
import { changeRoleAction, deactivateUserAction, inviteUserAction, reactivateUserAction } from "./actions";

export type UserRow = { id: string; name: string; email: string; role: Role; partyName: string; partyKind: string; status: "active" | "invited" | "deactivated" };

/** The roles a user of a party of this kind may hold (PARTY_KIND_FOR_ROLE); the server refuses any other. */
const rolesFor = (partyKind: string) => ROLES.filter((r) => PARTY_KIND_FOR_ROLE[r] === partyKind);

/** `manage`: the admin's table, with a role change and (de)activation on each row; the auditor's has neither. */
export function UsersTable({ rows, manage }: { rows: UserRow[]; manage: boolean }) {
  const t = useTranslations();
  const columns: ColumnDef<UserRow, any>[] = [
    { accessorKey: "name", header: t("users.name") },
    { accessorKey: "email", header: t("users.email") },
    { accessorKey: "role", header: t("users.role"), cell: (c) => t(`roles.${c.getValue()}`) },
    { accessorKey: "partyName", header: t("users.party") },
    { accessorKey: "status", header: t("users.status"), cell: (c) => t(`users.statuses.${c.getValue()}`) },
  ];
  if (manage) columns.push({ id: "change", header: t("users.actions"), cell: ChangeCell, enableSorting: false });
  return <DataTable data={rows} columns={columns} label={t("users.title")} testId="users-table" rowId={(u) => u.id} />;
}

// One component for every render (flexRender mounts a cell function as a component): the
// row's forms keep their answer when the table re-renders with the changed user.
function ChangeCell({ row }: CellContext<UserRow, unknown>) {
  return <UserChanges user={row.original} />;
}

function UserChanges({ user }: { user: UserRow }) {
  const t = useTranslations();
  const [roleState, roleAction, rolePending] = useActionState(changeRoleAction, initialFormState);
  const [statusState, statusAction, statusPending] = useActionState(user.status === "deactivated" ? reactivateUserAction : deactivateUserAction, initialFormState);
  const roles = rolesFor(user.partyKind);
  return (
    <div className="flex flex-wrap items-start gap-2" data-testid={`user-changes-${user.email}`}>
      {roles.length > 1 ? (
        <form action={roleAction} className="flex items-center gap-1">
          <input type="hidden" name="userId" value={user.id} />
          <select name="role" defaultValue={user.role} aria-label={t("users.newRole", { name: user.name })} className="field-input py-1">
            {roles.map((r) => (
              <option key={r} value={r}>{t(`roles.${r}`)}</option>
            ))}
          </select>
          <button type="submit" className="btn-quiet" disabled={rolePending}>{t("users.changeRole")}</button>
        </form>
      ) : null}
      <form action={statusAction}>
        <input type="hidden" name="userId" value={user.id} />
        <button type="submit" className="btn-quiet" disabled={statusPending}>{t(user.status === "deactivated" ? "users.reactivate" : "users.deactivate")}</button>
      </form>
      {[roleState, statusState].map((state, i) => (
        <div key={i} className="w-full text-xs">
          <FormMessage state={state} />
          {Object.values(state.fields ?? {}).flat().map((m) => <p key={m} className="field-error">{m}</p>)}
        </div>
      ))}
    </div>
  );
}

/** Picking a role narrows the parties to the kind that role belongs to (grower roles to growers …). */
export function InviteForm({ parties }: { parties: { id: string; name: string; kind: string }[] }) {
  const t = useTranslations();
  const [state, action, pending] = useActionState(inviteUserAction, initialFormState);
  const [role, setRole] = useState<Role>((state.values?.role as Role) ?? "brewer");
  const fitting = parties.filter((p) => p.kind === PARTY_KIND_FOR_ROLE[role]);
  return (
    <form action={action} className="grid gap-4 sm:grid-cols-2" noValidate>
      <div className="sm:col-span-2">
        <FormMessage state={state} />
      </div>
      <FormField label={t("users.name")} name="name" required defaultValue={state.ok ? "" : state.values?.name} errors={state.fields?.name} />
      <FormField label={t("users.email")} name="email" type="email" required defaultValue={state.ok ? "" : state.values?.email} errors={state.fields?.email} />
      <div>
        <label htmlFor="role" className="field-label">{t("users.role")}</label>
        <select id="role" name="role" className="field-input" value={role} onChange={(e) => setRole(e.target.value as Role)}>
          {ROLES.map((r) => (
            <option key={r} value={r}>{t(`roles.${r}`)}</option>
          ))}
        </select>
        {state.fields?.role ? <p className="field-error">{state.fields.role.join(" ")}</p> : null}
      </div>
      <div>
        <label htmlFor="partyId" className="field-label">{t("users.party")}</label>
        <select id="partyId" name="partyId" className="field-input" key={role} defaultValue={fitting.some((p) => p.id === state.values?.partyId) ? state.values?.partyId : fitting[0]?.id}>
          {fitting.map((p) => (
            <option key={p.id} value={p.id}>{`${p.name} — ${t(`parties.kinds.${p.kind}`)}`}</option>
          ))}
        </select>
        {fitting.length ? null : <p className="field-error">{t("users.noParties")}</p>}
        {state.fields?.partyId ? <p className="field-error">{state.fields.partyId.join(" ")}</p> : null}
      </div>
      <div className="sm:col-span-2">
        <button type="submit" className="btn" disabled={pending || !fitting.length}>{t("users.send")}</button>
      </div>
    </form>
  );
}
