import { handle, requireApiUser } from "@/server/http";
import { listTransactionRecords, parseDateRange, transactionsCsv } from "@/server/transactions-export";

/** The record of receipts and shipments for a date range, as a spreadsheet (rice traceability law). */
export const GET = handle(async (request, { t }) => {
  const actor = await requireApiUser(request);
  const query = new URL(request.url).searchParams;
  const range = parseDateRange({ from: query.get("from"), to: query.get("to") }, t);
  const csv = transactionsCsv(listTransactionRecords(actor, range, t), t);
  return new Response(csv, {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="grainline-transactions-${range.from}-to-${range.to}.csv"`,
      "cache-control": "no-store",
    },
  });
});
