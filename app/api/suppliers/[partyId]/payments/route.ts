import { z } from "zod";
import { handle, readJson, requireApiPermission } from "@/server/http";
import { recordPayment } from "@/server/supplier-office";

/** `{ date, amountYen, method, reference }` → 201 `{ id, balanceYen }`; the office only. */
export const POST = handle(async (request, { params, t }) => {
  const actor = await requireApiPermission(request, "ledger:manage");
  const body = await readJson(request, z.unknown(), t);
  return Response.json(recordPayment(actor, params.partyId ?? "", body, t), { status: 201 });
});
