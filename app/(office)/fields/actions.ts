"use server";

import { revalidatePath } from "next/cache";
import { formValues, type FormState } from "@/lib/form-state";
import { fieldSchema } from "@/lib/validation/fields";
import { guardAction } from "@/server/action";
import { createField } from "@/server/fields";
import { requireUser } from "@/server/session";

export async function createFieldAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const actor = await requireUser();
    createField(actor, fieldSchema.parse(values), t);
    revalidatePath("/fields");
    return { ok: true, message: t("fields.saved") };
  });
}
