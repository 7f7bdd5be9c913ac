"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { typedNumber } from "@/lib/validation/typed";
import { hourOfDayIn } from "@/i18n/dates";
import { breweryTimeZone } from "@/server/platform/settings";
import { normaliseLotCode } from "@/domain/lot-code";
import { can, canSeeLot } from "@/domain/permissions";
import { formValues, type FormState } from "@/lib/form-state";
import { eventSchema } from "@/lib/validation/events";
import { getQuantity } from "@/lib/get-quantity";
import { guardAction } from "@/server/platform/action";
import { getDb } from "@/server/platform/db";
import { forbidden, invalid } from "@/server/platform/errors";
import { lotByCode, recordEvent } from "@/server/ledger/events";
import { releaseLot } from "@/server/trace/hold-lots";
import { getParty } from "@/server/ledger/parties";
import { requireUser } from "@/server/accounts/session";

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

const shipmentForm = z.object({
  code: z.string().trim().min(1).max(20),
  counterpartyId: z.string().trim().min(1).max(64),
  date: z.iso.date(),
  quantity: typedNumber(0, 10_000_000, { positive: true }),
  referenceDoc: z.string().trim().min(1).max(100),
});

/**
 * Bottles or bulk sake leaving for a buyer: the shipping step, drawn from the lot (buyers never
 * hold lots), with the delivery slip the recall lists. Lots for a mill or brewery go by /dispatch.
 */
export async function shipToBuyerAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const actor = await requireUser();
    if (!can(actor, "polishing:record") && !can(actor, "brewing:record")) throw forbidden();
    const form = shipmentForm.parse(values);
    const code = normaliseLotCode(form.code);
    const lot = lotByCode(getDb(), code);
    if (!lot || !canSeeLot(actor, lot)) throw invalid({ code: [t("validation.unknownLot")] });
    const buyer = getParty(form.counterpartyId);
    if (!buyer || buyer.kind !== "buyer") throw invalid({ counterpartyId: [t("errors.notABuyer")] });
    if (lot.unit === "bottle" && !Number.isInteger(form.quantity)) throw invalid({ quantity: [t("floor.wholeBottles")] });
    const input = eventSchema.parse({
      step: "shipping",
      inputs: [{ lot: code, quantity: form.quantity }],
      counterpartyId: buyer.id,
      referenceDoc: form.referenceDoc,
      // Noon of the typed day on the brewery's clock: the record shows that day in its zone.
      at: hourOfDayIn(form.date, 12, breweryTimeZone()),
      // The office records on the holder's behalf, as on the dispatch page.
      partyId: lot.partyId === actor.partyId ? undefined : lot.partyId,
    });
    recordEvent(actor, input, t);
    revalidatePath(`/lots/${code}`);
    const amount = await getQuantity();
    return { ok: true, message: t("shipments.recorded", { amount: amount(form.quantity, lot.unit, 3), buyer: buyer.name }) };
  });
}

/** Releases one held lot, with the reason (audited). */
export async function releaseLotAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const actor = await requireUser();
    const { released } = releaseLot(actor, values);
    revalidatePath(`/lots/${released[0]}`);
    return { ok: true, message: t("holds.releasedOne", { code: released[0]! }) };
  });
}
