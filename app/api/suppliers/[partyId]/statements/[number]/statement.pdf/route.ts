import { documentLocale, documentTranslator } from "@/server/platform/document-locale";
import { handle, requireApiUser } from "@/server/platform/http";
import { statementPdf } from "@/server/suppliers/supplier-statement-files";
import { readStatement } from "@/server/suppliers/supplier-statements";
import { breweryTimeZone } from "@/server/platform/settings";

/** The statement in the reader's language (their setting, the language cookie, then the browser's). */
export const GET = handle(async (request, { params }) => {
  const actor = await requireApiUser(request);
  const statement = readStatement(actor, params.partyId ?? "", params.number ?? "");
  const locale = documentLocale(request, actor);
  const bytes = await statementPdf(statement, { t: documentTranslator(locale), locale, timeZone: breweryTimeZone() });
  return new Response(Buffer.from(bytes), {
    headers: { "content-type": "application/pdf", "content-disposition": `attachment; filename="grainline-statement-${statement.number}.pdf"`, "cache-control": "private, no-store" },
  });
});
