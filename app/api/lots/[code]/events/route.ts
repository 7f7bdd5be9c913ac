import { normaliseLotCode } from "@/domain/lot-code";
import { handle, requireApiUser } from "@/server/platform/http";
import { listLotEvents } from "@/server/ledger/lot-events";

export const GET = handle(async (request, { params }) => {
  const actor = await requireApiUser(request);
  return Response.json({ items: listLotEvents(actor, normaliseLotCode(params.code ?? "")) });
});
