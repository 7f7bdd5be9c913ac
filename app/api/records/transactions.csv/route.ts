import { csvDownload, csvEncodingOf } from "@/server/records/csv-download";
import { handle, requireApiUser } from "@/server/platform/http";
import { listTransactionRecords, parseDateRange, transactionsCsv } from "@/server/records/transactions-export";

/** The record of receipts and shipments for a date range, as a spreadsheet (rice traceability law). */
export const GET = handle(async (request, { t }) => {
  const actor = await requireApiUser(request);
  const query = new URL(request.url).searchParams;
  const range = parseDateRange({ from: query.get("from"), to: query.get("to") }, t);
  const encoding = csvEncodingOf(request, t);
  const csv = transactionsCsv(listTransactionRecords(actor, range, t), t);
  return csvDownload(csv, encoding, `grainline-transactions-${range.from}-to-${range.to}.csv`, t);
});
