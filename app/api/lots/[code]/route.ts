import { normaliseLotCode } from "@/domain/lot-code";
import { handle, requireApiUser } from "@/server/http";
import { getLot } from "@/server/lots";

export const GET = handle(async (request, { params }) => {
  const actor = await requireApiUser(request);
  return Response.json(getLot(actor, normaliseLotCode(params.code ?? "")));
});
