import { normaliseLotCode } from "@/domain/lot-code";
import { jsonRoute, reply, requireApiUser } from "@/server/platform/http";
import { lineageGraph } from "@/server/trace/lineage-graph";

/**
 * The whole lineage graph of a lot, as its graph page draws it. The page sends the first
 * view laid out; the browser asks for every lot here only when someone unfolds a stage.
 */
export const GET = jsonRoute(async (request, { params }) => {
  const actor = await requireApiUser(request);
  return reply(lineageGraph(actor, normaliseLotCode(params.code ?? "")));
});
