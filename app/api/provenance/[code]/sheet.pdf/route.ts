import { normaliseLotCode } from "@/domain/lot-code";
import { handle, requireApiPermission } from "@/server/http";
import { getParty } from "@/server/parties";
import { provenanceFor } from "@/server/provenance";
import { provenanceSheetPdf } from "@/server/provenance-sheet";

export const GET = handle(async (request, { params, t }) => {
  const actor = await requireApiPermission(request, "provenance:read");
  const code = normaliseLotCode(params.code ?? "");
  const answer = provenanceFor(actor, code, t);
  const bytes = await provenanceSheetPdf(answer, getParty(actor.partyId)?.name ?? "", t);
  return new Response(Buffer.from(bytes), {
    headers: { "content-type": "application/pdf", "content-disposition": `attachment; filename="grainline-provenance-${answer.lot.code}.pdf"`, "cache-control": "private" },
  });
});
