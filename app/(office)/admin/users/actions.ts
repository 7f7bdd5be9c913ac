"use server";

import { revalidatePath } from "next/cache";
import { formValues, type FormState } from "@/lib/form-state";
import { inviteSchema, roleChangeSchema, userRefSchema } from "@/lib/validation/people";
import { actionOrigin, guardAction } from "@/server/platform/action";
import { requirePermission } from "@/server/accounts/session";
import { changeUserRole, deactivateUser, reactivateUser } from "@/server/accounts/user-admin";
import { inviteUser } from "@/server/accounts/users";

export async function inviteUserAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const actor = await requirePermission("users:manage");
    const input = inviteSchema.parse(values);
    await inviteUser(actor, input, await actionOrigin(), t);
    revalidatePath("/admin/users");
    return { ok: true, message: t("users.sent", { email: input.email }) };
  });
}

export async function deactivateUserAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const actor = await requirePermission("users:manage");
    const { userId } = userRefSchema.parse(values);
    const { name } = deactivateUser(actor, userId, t);
    revalidatePath("/admin/users");
    return { ok: true, message: t("users.deactivated", { name }) };
  });
}

export async function reactivateUserAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const actor = await requirePermission("users:manage");
    const { userId } = userRefSchema.parse(values);
    const { name } = reactivateUser(actor, userId);
    revalidatePath("/admin/users");
    return { ok: true, message: t("users.reactivated", { name }) };
  });
}

export async function changeRoleAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const actor = await requirePermission("users:manage");
    const { userId, role } = roleChangeSchema.parse(values);
    const { name } = changeUserRole(actor, userId, role, t);
    revalidatePath("/admin/users");
    return { ok: true, message: t("users.roleChanged", { name, role: t(`roles.${role}`) }) };
  });
}
