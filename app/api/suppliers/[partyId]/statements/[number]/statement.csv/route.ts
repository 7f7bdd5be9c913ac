import { csvDownload, csvEncodingOf } from "@/server/records/csv-download";
import { handle, requireApiUser } from "@/server/platform/http";
import { statementCsv } from "@/server/suppliers/supplier-statement-files";
import { breweryTimeZone } from "@/server/platform/settings";
import { readStatement } from "@/server/suppliers/supplier-statements";

export const GET = handle(async (request, { params, t }) => {
  const actor = await requireApiUser(request);
  const statement = readStatement(actor, params.partyId ?? "", params.number ?? "");
  const encoding = csvEncodingOf(request, t);
  return csvDownload(statementCsv(statement, t, breweryTimeZone()), encoding, `grainline-statement-${statement.number}.csv`, t, "private, no-store");
});
