/**
 * The CSV of the supplier account's list, written by the server (`GET /api/suppliers/{partyId}/list.csv`)
 * rather than handed to the browser with the page: a mill's 1,535 polishing runs were 97 kB of
 * cells in every view of its account. The columns are the table's, in its order.
 */

import { csvText } from "@/lib/validation/csv";
import type { Translate } from "@/lib/validation/field-errors";
import type { Delivery, Run } from "@/server/suppliers/supplier-portal";
import { inView, listHeaders } from "./account-list-view";
import { DELIVERY_COLUMNS, deliveriesCsvRows, isUnpriced } from "./deliveries-view";
import { isUnpricedRun, RUN_COLUMNS, runsCsvRows } from "./runs-view";

type List = { kind: "deliveries"; rows: Delivery[] } | { kind: "runs"; rows: Run[] };

/** The CSV of a grower's deliveries or a mill's runs, all of them or only those no contract priced; `t` reads the whole catalogue. */
export function listCsv(list: List, unpricedOnly: boolean, t: Translate): string {
  const suppliers = (key: string) => t(`suppliers.${key}`);
  return list.kind === "deliveries"
    ? csvText(listHeaders(DELIVERY_COLUMNS, suppliers), deliveriesCsvRows(inView(list.rows, unpricedOnly, isUnpriced), suppliers("reversed")))
    : csvText(listHeaders(RUN_COLUMNS, suppliers), runsCsvRows(inView(list.rows, unpricedOnly, isUnpricedRun), suppliers("reversed")));
}
