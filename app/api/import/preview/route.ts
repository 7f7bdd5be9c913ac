import { handle, requireApiUser } from "@/server/platform/http";
import { previewImport, readImportRequest } from "@/server/records/csv-import";
import { UserQuota } from "@/server/accounts/user-quota";

// A preview writes (and undoes) every row of a file of up to 5,000 rows, about 2 ms each: one
// preview at a time per user, and 10,000 rows (two full files) a minute.
const previews = new UserQuota({ atOnce: 1, perMinute: 10_000, busy: "errors.previewRunning", tooMany: "errors.tooManyPreviews" });

/** Checks every row of a CSV import as if writing it, and writes nothing. */
export const POST = handle(async (request, { t }) => {
  const actor = await requireApiUser(request);
  const turn = previews.take(actor.id);
  try {
    const body = await readImportRequest(request, actor, t);
    turn.charge(body.rows.length);
    return Response.json(await previewImport(actor, body, t));
  } finally {
    turn.release();
  }
});
