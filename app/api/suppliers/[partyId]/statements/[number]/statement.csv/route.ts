import { csvDownload, csvEncodingOf } from "@/server/csv-download";
import { handle, requireApiUser } from "@/server/http";
import { statementCsv } from "@/server/supplier-statement-files";
import { breweryTimeZone } from "@/server/settings";
import { readStatement } from "@/server/supplier-statements";

export const GET = handle(async (request, { params, t }) => {
  const actor = await requireApiUser(request);
  const statement = readStatement(actor, params.partyId ?? "", params.number ?? "");
  const encoding = csvEncodingOf(request, t);
  return csvDownload(statementCsv(statement, t, breweryTimeZone()), encoding, `grainline-statement-${statement.number}.csv`, t, "private, no-store");
});
