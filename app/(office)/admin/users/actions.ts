"use server";

import { revalidatePath } from "next/cache";
import { formValues, type FormState } from "@/lib/form-state";
import { inviteSchema } from "@/lib/validation/people";
import { actionOrigin, guardAction } from "@/server/action";
import { requirePermission } from "@/server/session";
import { inviteUser } from "@/server/users";

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
