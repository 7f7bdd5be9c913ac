import { listCsv } from "@/components/supplier-lists/list-csv";
import { getDb } from "@/server/platform/db";
import { handle, requireApiUser } from "@/server/platform/http";
import { csvDownload, csvEncodingOf } from "@/server/records/csv-download";
import { requireReadableSupplier } from "@/server/suppliers/supplier-ledger";
import { deliveriesOf, runsOf } from "@/server/suppliers/supplier-portal";

/**
 * The supplier account's list as CSV, every row of the view: a grower's deliveries or a mill's
 * polishing runs, `?unpriced=1` for those no contract priced. Read as the ledger is: the office
 * and auditors any supplier, a grower or mill only its own (another's is unknown).
 */
export const GET = handle(async (request, { params, t }) => {
  const actor = await requireApiUser(request);
  const encoding = csvEncodingOf(request, t);
  const party = requireReadableSupplier(getDb(), actor, params.partyId ?? "");
  const unpricedOnly = new URL(request.url).searchParams.get("unpriced") === "1";
  const csv = party.kind === "grower" ? listCsv({ kind: "deliveries", rows: deliveriesOf(party.id) }, unpricedOnly, t) : listCsv({ kind: "runs", rows: runsOf(party.id) }, unpricedOnly, t);
  return csvDownload(csv, encoding, `grainline-${party.kind === "grower" ? "deliveries" : "runs"}.csv`, t);
});
