"use server";

import { revalidatePath } from "next/cache";
import { formValues, type FormState } from "@/lib/form-state";
import { eventSchema } from "@/lib/validation/events";
import { guardAction } from "@/server/action";
import { recordEvent } from "@/server/events";
import { requireUser } from "@/server/session";

export async function correctEventAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const actor = await requireUser();
    const input = eventSchema.parse({ step: "correcting", corrects: Number(values.corrects), reason: values.reason ?? "" });
    recordEvent(actor, input, t);
    revalidatePath(`/lots/${values.code}`);
    return { ok: true, message: t("lotPage.corrected_ok") };
  });
}
