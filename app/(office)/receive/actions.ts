"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { normaliseLotCode } from "@/domain/lot-code";
import { formValues, type FormState } from "@/lib/form-state";
import { eventSchema } from "@/lib/validation/events";
import { guardAction } from "@/server/action";
import { lotByCode, recordEvent } from "@/server/events";
import { forbidden, invalid } from "@/server/errors";
import { can } from "@/domain/permissions";
import { getDb } from "@/server/db";
import { getParty } from "@/server/parties";
import { requireUser } from "@/server/session";

const receiptForm = z.object({
  code: z.string().trim().min(1).max(20),
  referenceDoc: z.string().trim().max(100).default(""),
  place: z.string().trim().max(200).default(""),
  date: z.iso.date().optional().or(z.literal("").transform(() => undefined)),
  partyId: z.string().max(64).optional(),
});

/** A receipt takes the whole lot from whoever holds it now (../shared/references.md, rice traceability). */
export async function receiveLotAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const actor = await requireUser();
    if (!can(actor, "polishing:record") && !can(actor, "brewing:record")) throw forbidden();
    const form = receiptForm.parse(values);
    const code = normaliseLotCode(form.code);
    const lot = lotByCode(getDb(), code);
    if (!lot) throw invalid({ code: [t("validation.unknownLot")] });
    const input = eventSchema.parse({
      step: "receiving",
      inputs: [{ lot: code, quantity: lot.onHand }],
      referenceDoc: form.referenceDoc || undefined,
      place: form.place || undefined,
      at: form.date ? `${form.date}T12:00:00+09:00` : undefined,
      partyId: form.partyId || undefined,
    });
    recordEvent(actor, input, t);
    revalidatePath("/mill");
    return { ok: true, message: t("receive.recorded", { code, from: getParty(lot.partyId)?.name ?? "" }) };
  });
}
