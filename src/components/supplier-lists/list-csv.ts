/**
 * The CSV of the supplier account's list, written by the server (`GET /api/suppliers/{partyId}/list.csv`)
 * rather than handed to the browser with the page: a mill's 1,535 polishing runs were 97 kB of
 * cells in every view of its account. The columns are the table's, in its order.
 */

import { csvText } from "@/lib/validation/csv";
import type { Translate } from "@/lib/validation/field-errors";
import type { Delivery, Run } from "@/server/suppliers/supplier-portal";
import { deliveriesCsvRows, isUnpriced } from "./deliveries-view";
import { isUnpricedRun, runsCsvRows } from "./runs-view";

/** The columns of each list, as keys of the catalogue's `suppliers.columns`. */
export const DELIVERY_COLUMNS = ["date", "lot", "variety", "cropYear", "grade", "kg", "slip", "receiver", "amount", "status"] as const;
export const RUN_COLUMNS = ["date", "polished", "brownKg", "target", "achieved", "fee", "status"] as const;

/** A list's column headers, read by a translator of the `suppliers` namespace (the table's and the CSV's). */
export const listHeaders = (columns: readonly string[], t: (key: string) => string) => columns.map((c) => t(`columns.${c}`));

type List = { kind: "deliveries"; rows: Delivery[] } | { kind: "runs"; rows: Run[] };

/** The CSV of a grower's deliveries or a mill's runs, all of them or only those no contract priced; `t` reads the whole catalogue. */
export function listCsv(list: List, unpricedOnly: boolean, t: Translate): string {
  const suppliers = (key: string) => t(`suppliers.${key}`);
  if (list.kind === "deliveries") {
    const shown = unpricedOnly ? list.rows.filter(isUnpriced) : list.rows;
    return csvText(listHeaders(DELIVERY_COLUMNS, suppliers), deliveriesCsvRows(shown, suppliers("reversed")));
  }
  const shown = unpricedOnly ? list.rows.filter(isUnpricedRun) : list.rows;
  return csvText(listHeaders(RUN_COLUMNS, suppliers), runsCsvRows(shown, suppliers("reversed")));
}
