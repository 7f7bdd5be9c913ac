import { handle, requireApiUser } from "@/server/platform/http";
import { previewImport, readImportRequest } from "@/server/records/csv-import";
import { UserQuota } from "@/server/accounts/user-quota";

// A preview checks every row of a file of up to 10,000 rows (a harvest row about 30 µs, a
// receipt row, written and undone, about 2 ms): one preview at a time per user, and 20,000
// rows (two full files) a minute.
const previews = new UserQuota({ atOnce: 1, perMinute: 20_000, busy: "errors.previewRunning", tooMany: "errors.tooManyPreviews" });

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
