/** The supplier account's table of a mill's polishing runs: what a page of it shows, and its CSV. */

import type { Run, RunKey } from "@/server/suppliers/supplier-portal";
import { pageOfAccountList, type AccountListView } from "./account-list-view";

/** A run recorded while no contract set its fee (a reversed run earns nothing either way). */
export const isUnpricedRun = (r: RunKey) => r.feeYen === null && !r.reversed;

export const pageOfRuns = <T extends RunKey>(runs: T[], view: AccountListView) => pageOfAccountList(runs, view, isUnpricedRun);

/** The table's columns, in order, as keys of the catalogue's `suppliers.columns`: its CSV cells below follow them. */
export const RUN_COLUMNS = ["date", "polished", "brownKg", "target", "achieved", "fee", "status"] as const;

/**
 * The CSV's cells, as the office table's CSV wrote them: each column's plain value (kg and
 * ratios as numbers, the fee in yen or empty), dates as ISO 8601.
 */
export function runsCsvRows(runs: Run[], reversedLabel: string): unknown[][] {
  return runs.map((r) => [r.at.toISOString(), r.polished ?? "", r.brownKg ?? "", r.targetPct ?? "", r.achievedPct ?? "", r.feeYen ?? "", r.reversed ? reversedLabel : ""]);
}
