"use server";

import { revalidatePath } from "next/cache";
import { formValues, type FormState } from "@/lib/form-state";
import { guardAction } from "@/server/platform/action";
import { createProduct } from "@/server/ledger/products";
import { requireUser } from "@/server/accounts/session";

export async function createProductAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    // createProduct checks settings:manage itself.
    createProduct(await requireUser(), values, t);
    revalidatePath("/admin/products");
    return { ok: true, message: t("products.saved") };
  });
}
