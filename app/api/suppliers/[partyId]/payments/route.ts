import { z } from "zod";
import { handle, readJson, requireApiPermission } from "@/server/platform/http";
import { recordPayment } from "@/server/suppliers/supplier-payments";

/**
 * `{ date, amountYen, method, reference, overpaymentReason? }` → 201 `{ id, balanceYen }`; the
 * office only. More than the balance owed without `overpaymentReason`: 409 naming the balance.
 */
export const POST = handle(async (request, { params, t }) => {
  const actor = await requireApiPermission(request, "ledger:manage");
  const body = await readJson(request, z.unknown(), t);
  return Response.json(recordPayment(actor, params.partyId ?? "", body, t), { status: 201 });
});
