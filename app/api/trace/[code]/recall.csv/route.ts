import { normaliseLotCode } from "@/domain/lot-code";
import { forbidden } from "@/server/errors";
import { handle, requireApiUser } from "@/server/http";
import { canReadRecall, loadRecall, recallCsv, recallRows } from "@/server/recall";

/** Everything a lot reached, one line per event and lot, as a sortable spreadsheet (../shared/api.md, "Trace"). */
export const GET = handle(async (request, { params, t }) => {
  const actor = await requireApiUser(request);
  if (!canReadRecall(actor)) throw forbidden();
  const code = normaliseLotCode(params.code ?? "");
  const csv = recallCsv(recallRows(loadRecall(actor, code)), t);
  return new Response(csv, {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="grainline-recall-${encodeURIComponent(code)}.csv"`,
      "cache-control": "no-store",
    },
  });
});
