"use server";

import { revalidatePath } from "next/cache";
import { formValues, type FormState } from "@/lib/form-state";
import { guardAction } from "@/server/platform/action";
import { requireUser } from "@/server/accounts/session";
import { saveTaxRounding } from "@/server/suppliers/supplier-settings";

export async function saveRoundingAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const actor = await requireUser();
    saveTaxRounding(actor, values, t);
    revalidatePath("/suppliers");
    return { ok: true, message: t("suppliers.rounding.saved") };
  });
}
