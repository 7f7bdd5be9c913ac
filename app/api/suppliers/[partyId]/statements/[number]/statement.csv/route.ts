import { handle, requireApiUser } from "@/server/http";
import { statementCsv } from "@/server/supplier-statement-files";
import { readStatement } from "@/server/supplier-statements";

export const GET = handle(async (request, { params, t }) => {
  const actor = await requireApiUser(request);
  const statement = readStatement(actor, params.partyId ?? "", params.number ?? "");
  return new Response(statementCsv(statement, t), {
    headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="grainline-statement-${statement.number}.csv"`, "cache-control": "private, no-store" },
  });
});
