"use server";

import { revalidatePath } from "next/cache";
import { formValues, type FormState } from "@/lib/form-state";
import { guardAction } from "@/server/platform/action";
import { holdRecall, releaseRecall } from "@/server/trace/hold-lots";
import { requireUser } from "@/server/accounts/session";

/** Every lot the recall reached goes on hold at once, with the reason (audited). */
export async function holdRecallAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const actor = await requireUser();
    const { held } = holdRecall(actor, values);
    revalidatePath("/recall");
    return { ok: true, message: t("holds.heldCount", { count: held.length }) };
  });
}

/** Every held lot of the recall is released, with the reason (audited). */
export async function releaseRecallAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const actor = await requireUser();
    const { released } = releaseRecall(actor, values);
    revalidatePath("/recall");
    return { ok: true, message: t("holds.releasedCount", { count: released.length }) };
  });
}
