import { normaliseLotCode } from "@/domain/lot-code";
import { jsonRoute, reply, requireApiUser } from "@/server/platform/http";
import { getLot } from "@/server/ledger/lots";

export const GET = jsonRoute(async (request, { params }) => {
  const actor = await requireApiUser(request);
  return reply(getLot(actor, normaliseLotCode(params.code ?? "")));
});
