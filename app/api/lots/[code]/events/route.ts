import { normaliseLotCode } from "@/domain/lot-code";
import { handle, requireApiUser } from "@/server/http";
import { listLotEvents } from "@/server/lot-events";

export const GET = handle(async (request, { params }) => {
  const actor = await requireApiUser(request);
  return Response.json({ items: listLotEvents(actor, normaliseLotCode(params.code ?? "")) });
});
