import { normaliseLotCode } from "@/domain/lot-code";
import { forbidden } from "@/server/platform/errors";
import { recallEpcisDocument } from "@/server/trace/epcis";
import { handle, requireApiUser } from "@/server/platform/http";
import { canReadRecall, loadRecall } from "@/server/trace/recall";

/** The recall's events as a GS1 EPCIS 2.0 document in JSON-LD. */
export const GET = handle(async (request, { params }) => {
  const actor = await requireApiUser(request);
  if (!canReadRecall(actor)) throw forbidden();
  const code = normaliseLotCode(params.code ?? "");
  const document = recallEpcisDocument(loadRecall(actor, code));
  return new Response(JSON.stringify(document, null, 2), {
    headers: {
      "content-type": "application/ld+json; charset=utf-8",
      "content-disposition": `attachment; filename="grainline-epcis-${encodeURIComponent(code)}.jsonld"`,
      "cache-control": "no-store",
    },
  });
});
