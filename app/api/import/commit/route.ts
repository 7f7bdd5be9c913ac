import { handle, idempotencyKeyOf, requireApiUser } from "@/server/platform/http";
import { commitImport, readImportRequest } from "@/server/records/csv-import";

/** Writes every row of a CSV import, or — if any row fails — none, answering which rows failed. */
export const POST = handle(async (request, { t }) => {
  const actor = await requireApiUser(request);
  const body = await readImportRequest(request, actor, t);
  const { status, report } = commitImport(actor, body, t, idempotencyKeyOf(request));
  if (status !== 422) return Response.json(report, { status });
  const message = t("csv.import.notCommitted", { count: report.problems.length });
  return Response.json({ error: { code: "invalid", message }, ...report }, { status });
});
