"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { normaliseLotCode } from "@/domain/lot-code";
import { formValues, type FormState } from "@/lib/form-state";
import { eventSchema } from "@/lib/validation/events";
import { guardAction } from "@/server/platform/action";
import { lotByCode, recordEvent } from "@/server/ledger/events";
import { canSeeLot } from "@/domain/permissions";
import { getDb } from "@/server/platform/db";
import { invalid } from "@/server/platform/errors";
import { answerSchema, confirmReceiptRequest, declineReceiptRequest, declineSchema } from "@/server/ledger/receipt-requests";
import { requireUser } from "@/server/accounts/session";
import { breweryTimeZone } from "@/server/platform/settings";
import { hourOfDayIn } from "@/i18n/dates";
import { requireAny } from "@/server/ledger/event-rows";
import { STEP_RULES } from "@/domain/steps";


const dispatchForm = z.object({
  code: z.string().trim().min(1).max(20),
  counterpartyId: z.string().trim().min(1).max(64),
  referenceDoc: z.string().trim().min(1).max(100),
  place: z.string().trim().max(200).default(""),
  date: z.iso.date().optional().or(z.literal("").transform(() => undefined)),
});

/** The sender's word: the whole lot sent to the receiver under a delivery slip; custody moves at the receipt. */
export async function dispatchLotAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const actor = await requireUser();
    // Who sends lots at all (and so answers receipts awaiting its word): the shipping step's roles.
    requireAny(actor, STEP_RULES.shipping.permission);
    const form = dispatchForm.parse(values);
    const code = normaliseLotCode(form.code);
    // The sender ships what it holds: the slip weight is the lot's on-hand weight.
    const lot = lotByCode(getDb(), code);
    if (!lot || !canSeeLot(actor, lot)) throw invalid({ code: [t("validation.unknownLot")] });
    const input = eventSchema.parse({
      step: "shipping",
      inputs: [{ lot: code, quantity: lot.onHand }],
      counterpartyId: form.counterpartyId,
      referenceDoc: form.referenceDoc,
      place: form.place || undefined,
      // 09:00 of the typed day on the brewery's clock: the record shows that day in its zone.
      at: form.date ? hourOfDayIn(form.date, 9, breweryTimeZone()) : undefined,
      partyId: lot.partyId === actor.partyId ? undefined : lot.partyId,
    });
    recordEvent(actor, input, t);
    revalidatePath("/dispatch");
    return { ok: true, message: t("dispatch.recorded", { code }) };
  });
}

export async function confirmReceiptAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const actor = await requireUser();
    // Who sends lots at all (and so answers receipts awaiting its word): the shipping step's roles.
    requireAny(actor, STEP_RULES.shipping.permission);
    const { requestId } = answerSchema.parse(values);
    confirmReceiptRequest(actor, requestId, t);
    revalidatePath("/dispatch");
    return { ok: true, message: t("dispatch.confirmed") };
  });
}

export async function declineReceiptAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const actor = await requireUser();
    // Who sends lots at all (and so answers receipts awaiting its word): the shipping step's roles.
    requireAny(actor, STEP_RULES.shipping.permission);
    const { requestId, reason } = declineSchema.parse(values);
    declineReceiptRequest(actor, requestId, reason, t);
    revalidatePath("/dispatch");
    return { ok: true, message: t("dispatch.declined") };
  });
}
