import { normaliseLotCode } from "@/domain/lot-code";
import { documentLocale, documentTranslator } from "@/server/platform/document-locale";
import { handle, requireApiPermission } from "@/server/platform/http";
import { getParty } from "@/server/ledger/parties";
import { provenanceFor } from "@/server/trace/provenance";
import { provenanceSheetPdf } from "@/server/trace/provenance-sheet";
import { breweryTimeZone } from "@/server/platform/settings";

/** The sheet in the reader's language (their setting, the language cookie, then the browser's). */
export const GET = handle(async (request, { params }) => {
  const actor = await requireApiPermission(request, "provenance:read");
  const code = normaliseLotCode(params.code ?? "");
  const locale = documentLocale(request, actor);
  const t = documentTranslator(locale);
  const answer = provenanceFor(actor, code);
  const bytes = await provenanceSheetPdf(answer, getParty(actor.partyId)?.name ?? "", { t, locale, timeZone: breweryTimeZone() });
  return new Response(Buffer.from(bytes), {
    headers: { "content-type": "application/pdf", "content-disposition": `attachment; filename="grainline-provenance-${answer.lot.code}.pdf"`, "cache-control": "private" },
  });
});
