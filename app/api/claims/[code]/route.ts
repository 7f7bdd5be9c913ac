import { normaliseLotCode } from "@/domain/lot-code";
import { claimsFor } from "@/server/trace/claims";
import { handle, requireApiUser } from "@/server/platform/http";

export const GET = handle(async (request, { params, t }) => {
  const actor = await requireApiUser(request);
  return Response.json(claimsFor(actor, normaliseLotCode(params.code ?? ""), t));
});
