import { z } from "zod";
import { handle, readJson, requireApiPermission } from "@/server/platform/http";
import { reversePayment } from "@/server/suppliers/supplier-payments";

/** `{ reason }` → 201 `{ id, balanceYen }`; the office only. 404 for a payment not on this supplier's account, 409 when already reversed. */
export const POST = handle(async (request, { params, t }) => {
  const actor = await requireApiPermission(request, "ledger:manage");
  const body = await readJson(request, z.unknown(), t);
  return Response.json(reversePayment(actor, params.partyId ?? "", params.entryId ?? "", body, t), { status: 201 });
});
