"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { typedNumber } from "@/lib/validation/typed";
import { formValues, type FormState } from "@/lib/form-state";
import { harvestSchema } from "@/lib/validation/events";
import { fieldSchema } from "@/lib/validation/fields";
import { can } from "@/domain/permissions";
import { guardAction } from "@/server/platform/action";
import { forbidden } from "@/server/platform/errors";
import { createField } from "@/server/ledger/fields";
import { registerHarvest } from "@/server/ledger/harvests";
import { requireUser } from "@/server/accounts/session";

export async function createFieldAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const actor = await requireUser();
    if (!can(actor, "fields:write-own") && !can(actor, "fields:write-any")) throw forbidden();
    createField(actor, fieldSchema.parse(values), t);
    revalidatePath("/fields");
    return { ok: true, message: t("fields.saved") };
  });
}

const harvestForm = z.object({
  fieldId: z.string().min(1).max(64),
  variety: z.string(),
  // Read as typed ("1,260", "１４.８"); harvestSchema holds the bounds.
  cropYear: typedNumber(-Infinity, Infinity),
  brownKg: typedNumber(-Infinity, Infinity),
  moisturePct: typedNumber(-Infinity, Infinity),
  grade: z.string(),
  bags: typedNumber(-Infinity, Infinity),
});

export async function registerHarvestAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const actor = await requireUser();
    if (!can(actor, "harvests:record-own") && !can(actor, "harvests:record-any")) throw forbidden();
    const input = harvestSchema.parse(harvestForm.parse(values));
    const { body } = registerHarvest(actor, input, t);
    revalidatePath("/fields");
    const code = (body as { code: string }).code;
    return { ok: true, message: t("harvest.saved", { code }), values: { code } };
  });
}
