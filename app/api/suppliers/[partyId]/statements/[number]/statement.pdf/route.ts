import { handle, requireApiUser } from "@/server/http";
import { statementPdf } from "@/server/supplier-statement-files";
import { readStatement } from "@/server/supplier-statements";

export const GET = handle(async (request, { params, t }) => {
  const actor = await requireApiUser(request);
  const statement = readStatement(actor, params.partyId ?? "", params.number ?? "");
  const bytes = await statementPdf(statement, t);
  return new Response(Buffer.from(bytes), {
    headers: { "content-type": "application/pdf", "content-disposition": `attachment; filename="grainline-statement-${statement.number}.pdf"`, "cache-control": "private, no-store" },
  });
});
