import { handle, requireApiUser } from "@/server/http";
import { previewImport, readImportRequest } from "@/server/csv-import";

/** Checks every row of a CSV import as if writing it, and writes nothing. */
export const POST = handle(async (request, { t }) => {
  const actor = await requireApiUser(request);
  const body = await readImportRequest(request, actor, t);
  return Response.json(previewImport(actor, body, t));
});
