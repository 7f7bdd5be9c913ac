"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { typedNumber } from "@/lib/validation/typed";
import { hourOfDayIn } from "@/i18n/dates";
import { breweryTimeZone } from "@/server/platform/settings";
import { normaliseLotCode } from "@/domain/lot-code";
import { formValues, type FormState } from "@/lib/form-state";
import { eventSchema } from "@/lib/validation/events";
import { guardAction } from "@/server/platform/action";
import { recordEvent } from "@/server/ledger/events";
import { forbidden } from "@/server/platform/errors";
import { can } from "@/domain/permissions";
import { requireUser } from "@/server/accounts/session";

const receiptForm = z.object({
  code: z.string().trim().min(1).max(20),
  quantity: typedNumber(0, 10_000_000, { positive: true }),
  referenceDoc: z.string().trim().max(100).default(""),
  place: z.string().trim().max(200).default(""),
  date: z.iso.date().optional().or(z.literal("").transform(() => undefined)),
  partyId: z.string().max(64).optional(),
});

/**
 * A receipt: the lot named and its weight on arrival (../shared/references.md, rice traceability).
 * It moves the lot only when it answers the sender's dispatch; otherwise it waits for the sender.
 */
export async function receiveLotAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const actor = await requireUser();
    if (!can(actor, "polishing:record") && !can(actor, "brewing:record")) throw forbidden();
    const form = receiptForm.parse(values);
    const code = normaliseLotCode(form.code);
    const input = eventSchema.parse({
      step: "receiving",
      inputs: [{ lot: code, quantity: form.quantity }],
      referenceDoc: form.referenceDoc || undefined,
      place: form.place || undefined,
      // Noon of the typed day on the brewery's clock: the record shows that day in its zone.
      at: form.date ? hourOfDayIn(form.date, 12, breweryTimeZone()) : undefined,
      partyId: form.partyId || undefined,
    });
    const { status } = recordEvent(actor, input, t);
    revalidatePath("/mill");
    revalidatePath("/receive");
    return { ok: true, message: t(status === 202 ? "receive.awaiting" : "receive.recorded", { code }) };
  });
}
