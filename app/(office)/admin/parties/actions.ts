"use server";

import { revalidatePath } from "next/cache";
import { formValues, type FormState } from "@/lib/form-state";
import { partySchema } from "@/lib/validation/people";
import { guardAction } from "@/server/platform/action";
import { createParty, updateParty } from "@/server/ledger/parties";
import { requirePermission } from "@/server/accounts/session";

export async function createPartyAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const actor = await requirePermission("parties:manage");
    createParty(actor, partySchema.parse(values));
    revalidatePath("/admin/parties");
    return { ok: true, message: t("parties.saved") };
  });
}

export async function updatePartyAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const actor = await requirePermission("parties:manage");
    updateParty(actor, values.id ?? "", partySchema.parse(values));
    revalidatePath("/admin/parties");
    return { ok: true, message: t("parties.saved"), values };
  });
}
