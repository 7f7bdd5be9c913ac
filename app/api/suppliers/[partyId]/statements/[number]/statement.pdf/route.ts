import { DEFAULT_TIME_ZONE } from "@/i18n/dates";
import { documentLocale, documentTranslator } from "@/server/document-locale";
import { handle, requireApiUser } from "@/server/http";
import { statementPdf } from "@/server/supplier-statement-files";
import { readStatement } from "@/server/supplier-statements";

/** The statement in the reader's language (their setting, the language cookie, then the browser's). */
export const GET = handle(async (request, { params }) => {
  const actor = await requireApiUser(request);
  const statement = readStatement(actor, params.partyId ?? "", params.number ?? "");
  const locale = documentLocale(request, actor);
  const bytes = await statementPdf(statement, { t: documentTranslator(locale), locale, timeZone: DEFAULT_TIME_ZONE });
  return new Response(Buffer.from(bytes), {
    headers: { "content-type": "application/pdf", "content-disposition": `attachment; filename="grainline-statement-${statement.number}.pdf"`, "cache-control": "private, no-store" },
  });
});
