import { z } from "zod";
import { handle, readJson, requireApiPermission } from "@/server/platform/http";
import { recordAdjustment } from "@/server/suppliers/supplier-office";

/** `{ date, amountYen, taxRatePct, reason }` → 201 `{ id, balanceYen }`; the office only. */
export const POST = handle(async (request, { params, t }) => {
  const actor = await requireApiPermission(request, "ledger:manage");
  const body = await readJson(request, z.unknown(), t);
  return Response.json(recordAdjustment(actor, params.partyId ?? "", body, t), { status: 201 });
});
