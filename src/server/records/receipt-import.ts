import "server-only";
import type { DbOrTx } from "@/db/client";
import { parties } from "@/db/schema";
import { noonOn, receiptCsvRowSchema, type ImportRequest } from "@/lib/validation/csv";
import { eventSchema } from "@/lib/validation/events";
import type { Translate } from "@/lib/validation/field-errors";
import { invalid } from "../platform/errors";
import { breweryTimeZone } from "../platform/settings";
import { applyEvent } from "../ledger/events";
import type { SessionUser } from "../accounts/session";
import { merge, problemOf, resolve, valuesOf, type RowProblem } from "./import-cells";

/**
 * Writes the receipt rows in order while `more(rows done)` says so; all of them by default. A
 * receipt moves a lot, and a later row may name the same lot, so each row is written (inside
 * the caller's transaction) for the rows after it to see.
 */
export function runReceiptRows(tx: DbOrTx, actor: SessionUser, body: ImportRequest, columns: Map<string, number>, t: Translate, more = (_done: number) => true) {
  const problems: RowProblem[] = [];
  const created: { line: number; code: string }[] = [];
  let checked = 0;
  for (const { line, cells } of body.rows) {
    if (!more(checked)) break;
    checked += 1;
    try {
      const values = valuesOf(cells, body.header.length, columns, t);
      // A savepoint per row: a row that fails halfway leaves nothing for the rows after it.
      created.push({ line, code: tx.transaction((row) => importReceiptRow(row, actor, values, t)) });
    } catch (error) {
      problems.push({ line, ...problemOf(error, "receipts", t) });
    }
  }
  return { problems, created, checked };
}

function importReceiptRow(tx: DbOrTx, actor: SessionUser, values: Record<string, string>, t: Translate): string {
  const row = receiptCsvRowSchema.safeParse(values);
  const from = resolve(tx, parties, values.from, undefined, "from", t("validation.unknownCounterparty"), t);
  if (!row.success || typeof from !== "string") throw invalid(merge(row, from, t));
  const { lot, quantity, receivedOn, deliverySlip, place } = row.data;
  const input = eventSchema.parse({
    step: "receiving",
    at: noonOn(receivedOn, breweryTimeZone(tx)),
    inputs: [{ lot, quantity }],
    counterpartyId: from,
    ...(deliverySlip ? { referenceDoc: deliverySlip } : {}),
    ...(place ? { place } : {}),
  });
  applyEvent(tx, actor, input, t);
  return lot;
}
