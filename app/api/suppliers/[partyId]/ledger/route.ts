import { handle, requireApiUser } from "@/server/platform/http";
import { readSupplierLedger } from "@/server/suppliers/supplier-ledger";

/** A supplier's balance and entries (../shared/api.md); growers and mills only their own. */
export const GET = handle(async (request, { params }) => {
  const actor = await requireApiUser(request);
  return Response.json(readSupplierLedger(actor, params.partyId ?? ""), { headers: { "cache-control": "no-store" } });
});
