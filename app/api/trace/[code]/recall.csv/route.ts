import { normaliseLotCode } from "@/domain/lot-code";
import { csvDownload, csvEncodingOf } from "@/server/records/csv-download";
import { forbidden } from "@/server/platform/errors";
import { handle, requireApiUser } from "@/server/platform/http";
import { canReadRecall, recallCsv } from "@/server/trace/recall";
import { recallLines } from "@/server/trace/recall-lines";

/** Everything a lot reached, one line per event and lot, as a sortable spreadsheet (../shared/api.md, "Trace"). */
export const GET = handle(async (request, { params, t }) => {
  const actor = await requireApiUser(request);
  if (!canReadRecall(actor)) throw forbidden();
  const encoding = csvEncodingOf(request, t);
  const code = normaliseLotCode(params.code ?? "");
  const csv = recallCsv(recallLines(actor, code), t);
  return csvDownload(csv, encoding, `grainline-recall-${encodeURIComponent(code)}.csv`, t);
});
